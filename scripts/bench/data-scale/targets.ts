// What the data-scale benchmark requests: every list page, a unit, a capture, the trends, the review
// queue, the client portal and the bench API list, each as the role that uses it.
import pg from "pg";
import { getEnv } from "@/lib/server/env";

export type Who = "manager" | "qa" | "client" | "station";
export type Target = { name: string; path: string; who: Who };

export const ACCOUNTS: Record<Exclude<Who, "station">, string> = {
  manager: "maren.ilsley@harrowgate.example",
  qa: "ines.vardy@harrowgate.example",
  client: "ruan.petit@kestrum.example",
};

/** Ids of a seeded unit (the middle of the seeded serials, SC005001 at full size), its latest capture, its rating and an instrument, read from the scale database. */
async function sampleIds() {
  const client = new pg.Client({ connectionString: getEnv().DATABASE_URL });
  await client.connect();
  try {
    const q = async (sql: string) => {
      const row = (await client.query<{ id: string }>(sql)).rows[0];
      if (!row) throw new Error(`data-scale: nothing for ${sql}`);
      return row.id;
    };
    return {
      unit: await q("select id from units where serial = (select serial from units where serial like 'SC%' order by serial offset (select count(*) / 2 from units where serial like 'SC%') limit 1)"),
      capture: await q("select c.id from captures c join units u on u.id = c.unit_id where u.serial = (select serial from units where serial like 'SC%' order by serial offset (select count(*) / 2 from units where serial like 'SC%') limit 1) order by c.created_at desc limit 1"),
      rating: await q("select r.id from ratings r join units u on u.rating_id = r.id where u.serial = (select serial from units where serial like 'SC%' order by serial offset (select count(*) / 2 from units where serial like 'SC%') limit 1)"),
      instrument: await q("select id from instruments where asset_tag = 'HG-OSC-07'"),
      // The place of the last row of page 199, as that page's "Next" link carries it (db/queries/capture-list.ts).
      place200: await q(`select to_char(c.created_at at time zone 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.US"Z"') || '~' || c.id as id from captures c
        where c.lab_id = (select u.lab_id from units u where u.serial like 'SC%' limit 1) order by c.created_at desc, c.id asc offset 199 * 50 - 1 limit 1`),
      clientUnit: await q("select u.id from units u join organisations o on o.id = u.organisation_id where o.slug = 'kestrum' and u.serial like 'SC%' order by u.serial desc limit 1"),
    };
  } finally {
    await client.end();
  }
}

export async function listTargets(): Promise<Target[]> {
  const id = await sampleIds();
  return [
    { name: "dashboard", path: "/", who: "manager" },
    { name: "units", path: "/units", who: "manager" },
    { name: "units page 50", path: "/units?page=50", who: "manager" },
    { name: "units search", path: "/units?q=SC0042", who: "manager" },
    { name: "unit page", path: `/units/${id.unit}`, who: "manager" },
    { name: "captures", path: "/captures", who: "manager" },
    { name: "captures by THD", path: "/captures?sort=thd", who: "manager" },
    { name: "captures failed", path: "/captures?state=failed", who: "manager" },
    { name: "captures page 200", path: "/captures?page=200", who: "manager" },
    { name: "captures page 200 by Next", path: `/captures?page=200&after=${encodeURIComponent(id.place200)}`, who: "manager" },
    { name: "capture page", path: `/captures/${id.capture}`, who: "manager" },
    { name: "review queue", path: "/review", who: "qa" },
    { name: "trends", path: "/trends", who: "manager" },
    { name: "trends of a rating", path: `/trends?rating=${id.rating}`, who: "manager" },
    { name: "ratings", path: "/ratings", who: "manager" },
    { name: "rating page", path: `/ratings/${id.rating}`, who: "manager" },
    { name: "instruments", path: "/admin/instruments", who: "manager" },
    { name: "instrument page", path: `/admin/instruments/${id.instrument}`, who: "manager" },
    { name: "clients", path: "/admin/clients", who: "manager" },
    { name: "stations", path: "/stations", who: "manager" },
    { name: "people", path: "/admin/people", who: "manager" },
    { name: "mailbox", path: "/admin/mailbox", who: "manager" },
    { name: "portal reports", path: "/portal", who: "client" },
    { name: "portal units", path: "/units", who: "client" },
    { name: "portal unit page", path: `/units/${id.clientUnit}`, who: "client" },
    { name: "portal captures", path: "/captures", who: "client" },
    { name: "GET /api/v1/captures", path: "/api/v1/captures", who: "station" },
  ];
}
