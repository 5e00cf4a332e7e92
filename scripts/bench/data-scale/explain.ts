/**
 * The EXPLAIN half of `npm run bench -- --data-scale`: calls the queries the measured pages run
 * (db/queries, with the scale database's lab and client scopes), times every SQL statement they send
 * (pg's Client.query, wrapped), then prints EXPLAIN (ANALYZE, BUFFERS) of the three slowest.
 */
import pg from "pg";
import { placeOf } from "@/lib/captures/list-query";
import { listCapturePage } from "@/db/queries/capture-list";
import { getCaptureDetail, listCapturesForUnit } from "@/db/queries/captures";
import { closeDb } from "@/db/queries/connection";
import { listClientReports } from "@/db/queries/portal";
import { listLatestVerdicts, listVerdictsOfCaptures } from "@/db/queries/review-checks";
import { listTrendFigures, listFigureOfRecord, listLabRatingsWithUnits } from "@/db/queries/trends";
import { countReviewQueue, listReviewQueue } from "@/db/queries/unit-events";
import { evaluateUnitPlan } from "@/db/queries/unit-plan";
import { countUnitsByOverall, listUnits } from "@/db/queries/units";
import type { Scope } from "@/db/queries/scope";
import { getEnv } from "@/lib/server/env";

type Sent = { text: string; values: unknown[]; ms: number; from: string };
const sent: Sent[] = [];
let current = "";
type QueryFn = (this: pg.Client, ...args: unknown[]) => Promise<unknown>;
const original = pg.Client.prototype.query as unknown as QueryFn;
(pg.Client.prototype as unknown as { query: QueryFn }).query = function (this: pg.Client, ...args: unknown[]) {
  const config = args[0] as { text?: string; values?: unknown[] } | string;
  const text = typeof config === "string" ? config : config.text ?? "";
  const values = (typeof config === "string" ? undefined : config.values) ?? (Array.isArray(args[1]) ? (args[1] as unknown[]) : []);
  const started = performance.now();
  const note = () => { if (/^\s*select/i.test(text)) sent.push({ text, values, ms: performance.now() - started, from: current }); };
  // The pool calls with a callback (no promise comes back); drizzle's own client calls without one.
  const last = args.length - 1;
  const callback = args[last];
  if (typeof callback === "function") {
    args[last] = (...result: unknown[]) => { note(); return (callback as (...r: unknown[]) => unknown)(...result); };
    return original.apply(this, args);
  }
  return original.apply(this, args).then((result) => { note(); return result; });
};

async function ids() {
  const c = new pg.Client({ connectionString: getEnv().DATABASE_URL });
  await c.connect();
  const one = async (sql: string) => ((await c.query<{ id: string }>(sql)).rows[0]?.id ?? "");
  const out = {
    lab: await one("select id from organisations where slug = 'harrowgate-lab'"),
    client: await one("select id from organisations where slug = 'kestrum'"),
    unit: await one("select id from units where serial = (select serial from units where serial like 'SC%' order by serial offset (select count(*) / 2 from units where serial like 'SC%') limit 1)"),
    rating: await one("select rating_id as id from units where serial = (select serial from units where serial like 'SC%' order by serial offset (select count(*) / 2 from units where serial like 'SC%') limit 1)"),
  };
  await c.end();
  return out;
}

async function run(name: string, call: () => Promise<unknown>) {
  current = name;
  await call(); // warms the caches; only the second run's statements are kept
  sent.length = 0;
  await call();
  return sent.splice(0);
}

try {
  const id = await ids();
  const lab: Scope & { kind: "lab" } = { kind: "lab", labId: id.lab };
  const client: Scope = { kind: "manufacturer", organisationId: id.client };
  const latest = (await listCapturesForUnit(lab, id.unit))[0]?.id ?? "";
  const page = { sort: "captured" as const, dir: "desc" as const, limit: 51, offset: 0 };
  // Page 199's last row: where page 200's "Next" link starts.
  const last199 = (await listCapturePage(lab, { ...page, limit: 1, offset: 199 * 50 - 1 }))[0];
  const place200 = last199 ? placeOf(last199.place) : undefined;
  const calls: [string, () => Promise<unknown>][] = [
    ["units list", () => listUnits(lab, { limit: 51 })],
    ["home counts", () => countUnitsByOverall(lab)],
    ["captures list", () => listCapturePage(lab, page)],
    ["captures by THD", () => listCapturePage(lab, { ...page, sort: "thd" })],
    ["captures page 200", () => listCapturePage(lab, { ...page, offset: 199 * 50 })],
    ["captures page 200 by place", () => listCapturePage(lab, { ...page, after: place200 })],
    ["client captures", () => listCapturePage(client, page)],
    ["client units", () => listUnits(client, { limit: 51 })],
    ["unit captures", () => listCapturesForUnit(lab, id.unit)],
    ["unit plan", () => evaluateUnitPlan(lab, id.unit)],
    ["capture detail", () => getCaptureDetail(lab, latest)],
    ["review queue", () => listReviewQueue(lab, { limit: 51, offset: 0 })],
    ["review count", () => countReviewQueue(lab, 10_000)],
    ["review verdicts", () => listVerdictsOfCaptures(lab, [latest])],
    ["review latest", () => listLatestVerdicts(lab, [id.unit])],
    ["trend ratings", () => listLabRatingsWithUnits(id.lab)],
    ["trend figures", () => listTrendFigures(id.lab, id.rating)],
    ["trend of record", () => listFigureOfRecord(id.lab, { ratingId: id.rating, figure: "thd", harmonicOrder: 0, check: "thd" }, {})],
    // The trends page's first series: every unit's record comes from a plan step.
    ["trend of record (voltage)", () => listFigureOfRecord(id.lab, { ratingId: id.rating, figure: "voltage", harmonicOrder: 0, check: "voltage" }, {})],
    ["portal reports", () => listClientReports(id.client)],
  ];
  const all: Sent[] = [];
  for (const [name, call] of calls) all.push(...(await run(name, call)));
  all.sort((a, b) => b.ms - a.ms);
  console.log("slowest statements (warm, ms):");
  for (const s of all.slice(0, 8)) console.log(`  ${s.ms.toFixed(1).padStart(8)}  ${s.from}`);
  const c = new pg.Client({ connectionString: getEnv().DATABASE_URL });
  await c.connect();
  for (const s of all.slice(0, 3)) {
    console.log(`\n-- ${s.from} (${s.ms.toFixed(1)} ms)\n${s.text}\n-- parameters: ${JSON.stringify(s.values).slice(0, 300)}`);
    const plan = await original.call(c as pg.Client, `explain (analyze, buffers) ${s.text}`, s.values) as { rows: { "QUERY PLAN": string }[] };
    console.log(plan.rows.map((r) => r["QUERY PLAN"]).join("\n"));
  }
  await c.end();
} finally {
  await closeDb();
}
