import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { getDb } from "@/db/client";
import { insertUnitOnce } from "@/db/queries/units";
import { captures, ratings } from "@/db/schema";
import type { SessionUser } from "@/lib/auth/options";
import { captureListQuerySchema } from "@/lib/captures/list-query";
import { requireSessionActor } from "@/lib/dal/actor";
import { CAPTURE_PAGE_SIZE, getCaptureListView } from "@/lib/dal/capture-list";
import { GET as listRoute } from "@/app/api/captures/route";
import { closeConnections } from "./pipeline-support";
import { run, SEEDED, sessionUserOf } from "./ratings-support";

// The captures list's Next and Previous by place, through the DAL and the JSON route: 2.4 pages of
// captures, every fifth sharing its neighbour's capture time, walked both ways against the whole list.

const session = vi.hoisted(() => ({ current: null as SessionUser | null }));
vi.mock("next-auth", async (original) => ({ ...(await original<object>()), getServerSession: async () => (session.current ? { user: session.current } : null) }));

const serial = `PG${run}`;
const COUNT = CAPTURE_PAGE_SIZE * 2 + 20;

beforeAll(async () => {
  session.current = await sessionUserOf(SEEDED.admin);
  const labId = session.current.organisationId;
  const [rating] = await getDb().select().from(ratings).where(eq(ratings.labId, labId)).limit(1);
  const unit = await insertUnitOnce({ kind: "lab", labId }, { serial, ratingId: rating!.id, organisationId: rating!.organisationId });
  const start = Date.UTC(2026, 0, 7, 8);
  await getDb().insert(captures).values(Array.from({ length: COUNT }, (_, i) => ({
    unitId: unit.id, labId, testKind: "no-load" as const, originalName: `${serial}-${String(i).padStart(3, "0")}.csv`, objectKey: `test/${serial}/${i}`,
    sizeBytes: 100, sha256: `${serial}-${String(i).padStart(3, "0")}`.padEnd(64, "z"), state: "rejected" as const, createdAt: new Date(start + (i - (i % 5 === 4 ? 1 : 0)) * 1000),
  })));
}, 60_000);

afterAll(closeConnections);

const view = async (extra: Record<string, string> = {}) => getCaptureListView(await requireSessionActor(), captureListQuerySchema.parse({ q: serial, ...extra }));
const names = (rows: { originalName: string }[]) => rows.map((r) => r.originalName);

describe("the captures list by place", () => {
  it("walks Next to the end and Previous back to page 1 with every capture once, in order", async () => {
    const expected = Array.from({ length: COUNT }, (_, i) => i).sort((a, b) => {
      const t = (i: number) => i - (i % 5 === 4 ? 1 : 0);
      return t(b) - t(a);
    });
    const pages = [await view()];
    expect(pages[0]!.hasPrevious).toBe(false);
    while (pages.at(-1)!.hasMore) {
      const last = pages.at(-1)!;
      pages.push(await view({ page: String(last.page + 1), after: last.after! }));
    }
    expect(pages.map((p) => p.rows.length)).toEqual([CAPTURE_PAGE_SIZE, CAPTURE_PAGE_SIZE, 20]);
    const forward = pages.flatMap((p) => names(p.rows));
    expect(new Set(forward).size).toBe(COUNT);
    // Equal times keep the id order, which is not the name order: compare as sets per time, and the times' order.
    expect(forward.map((n) => Number(n.slice(-7, -4))).map((i) => i - (i % 5 === 4 ? 1 : 0))).toEqual(expected.map((i) => i - (i % 5 === 4 ? 1 : 0)));
    const back = [pages.at(-1)!];
    while (back[0]!.hasPrevious) back.unshift(await view({ page: String(back[0]!.page - 1), before: back[0]!.before! }));
    expect(back).toHaveLength(3);
    expect(back[0]!.page).toBe(1);
    expect(back.flatMap((p) => names(p.rows))).toEqual(forward);
  });

  it("shows the first page whole when fewer than a page lie before the place", async () => {
    const first = await view();
    const third = names(first.rows)[3]!;
    const fromFourth = await view({ page: "2", after: `${first.rows[2]!.createdAt.replace(/\.(\d{3})Z$/, ".$1000Z")}~${first.rows[2]!.id}` });
    expect(names(fromFourth.rows)[0]).toBe(third);
    const back = await view({ page: "2", before: fromFourth.before! });
    expect(back.page).toBe(1);
    expect(names(back.rows)).toEqual(names(first.rows));
  });

  it("answers JSON with the next place, and 400 naming a bad one", async () => {
    const first = await (await listRoute(new Request(`http://local/api/captures?q=${serial}`))).json() as { captures: { id: string }[]; next?: string; hasMore: boolean };
    expect(first.captures).toHaveLength(CAPTURE_PAGE_SIZE);
    expect(first.next).toMatch(/~/);
    const second = await (await listRoute(new Request(`http://local/api/captures?q=${serial}&after=${encodeURIComponent(first.next!)}`))).json() as { captures: { id: string }[] };
    expect(second.captures[0]!.id).not.toBe(first.captures.at(-1)!.id);
    expect(new Set([...first.captures, ...second.captures].map((c) => c.id)).size).toBe(CAPTURE_PAGE_SIZE * 2);
    const bad = await listRoute(new Request(`http://local/api/captures?after=yesterday`));
    expect(bad.status).toBe(400);
    expect(JSON.stringify(await bad.json())).toMatch(/after/);
  });
});
