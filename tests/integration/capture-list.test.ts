import { eq, sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb, getDb } from "@/db/client";
import { listCapturePage, type CaptureListFilter } from "@/db/queries/capture-list";
import { insertUnitOnce } from "@/db/queries/units";
import { analyses, captures, ratings, type CaptureState } from "@/db/schema";
import { captureListQuerySchema, placeOf } from "@/lib/captures/list-query";
import { seededOrgs } from "./helpers";

// Captures inserted straight into the tables: the list must filter and sort on the stored columns.
// None is queued, so no worker running beside the suite picks one up.
const tag = `CL${Date.now() % 1_000_000}`;
let labId: string;
let kestrumId: string;
let poldaneId: string;

type Seed = { serial: string; state: CaptureState; kind: "no-load" | "back-emf"; thd?: number; ke?: number; overall?: "pass" | "fail" };
const seeds: Seed[] = [
  { serial: `${tag}-A`, state: "analysed", kind: "no-load", thd: 1.2, overall: "pass" },
  { serial: `${tag}-A`, state: "analysed", kind: "no-load", thd: 6.5, overall: "fail" },
  { serial: `${tag}-B`, state: "analysed", kind: "back-emf", thd: 2.0, ke: 118, overall: "pass" },
  { serial: `${tag}-B`, state: "rejected", kind: "back-emf" },
  { serial: `${tag}-C`, state: "uploading", kind: "no-load" },
];

beforeAll(async () => {
  const orgs = await seededOrgs();
  labId = orgs.lab.id;
  kestrumId = orgs.kestrum.id;
  poldaneId = orgs.poldane.id;
  const rating = (await getDb().select().from(ratings).where(eq(ratings.organisationId, kestrumId)).limit(1))[0];
  if (!rating) throw new Error("no seeded Kestrum rating");
  for (const [i, s] of seeds.entries()) {
    const unit = await insertUnitOnce({ kind: "lab", labId }, { serial: s.serial, ratingId: rating.id, organisationId: kestrumId });
    const [c] = await getDb().insert(captures).values({
      unitId: unit.id, labId, testKind: s.kind, originalName: `${tag}-${i}.csv`, objectKey: `test/${tag}/${i}`, sizeBytes: 100,
      sha256: `${tag}-${i}`.padEnd(64, "0"), state: s.state, createdAt: new Date(Date.now() - (10 - i) * 60_000),
    }).returning();
    if (c && s.thd !== undefined) {
      await getDb().insert(analyses).values({
        captureId: c.id, analysisVersion: "test", toleranceDigest: "test", report: {}, overall: s.overall, worstThdPercent: s.thd, keLineRmsPerKrpm: s.ke ?? null,
      });
    }
  }
});

afterAll(async () => {
  await closeDb();
});

const base: CaptureListFilter = { search: tag, sort: "captured", dir: "desc", limit: 50, offset: 0 };
const lab = () => ({ kind: "lab" as const, labId });
const names = (rows: { originalName: string }[]) => rows.map((r) => r.originalName);

describe("listCapturePage", () => {
  it("lists newest first, filtered by serial", async () => {
    expect(names(await listCapturePage(lab(), base))).toEqual([4, 3, 2, 1, 0].map((i) => `${tag}-${i}.csv`));
    expect(names(await listCapturePage(lab(), { ...base, search: `${tag}-B` }))).toEqual([`${tag}-3.csv`, `${tag}-2.csv`]);
  });

  it("filters on state, verdict (or no result yet) and test kind", async () => {
    expect(names(await listCapturePage(lab(), { ...base, state: "rejected" }))).toEqual([`${tag}-3.csv`]);
    expect(names(await listCapturePage(lab(), { ...base, overall: "fail" }))).toEqual([`${tag}-1.csv`]);
    expect(names(await listCapturePage(lab(), { ...base, overall: "unjudged" }))).toEqual([`${tag}-4.csv`, `${tag}-3.csv`]);
    expect(names(await listCapturePage(lab(), { ...base, testKind: "back-emf" }))).toEqual([`${tag}-3.csv`, `${tag}-2.csv`]);
  });

  it("sorts on a figure either way with captures lacking it last, and pages", async () => {
    expect(names(await listCapturePage(lab(), { ...base, sort: "thd", dir: "desc" })).slice(0, 3)).toEqual([`${tag}-1.csv`, `${tag}-2.csv`, `${tag}-0.csv`]);
    const asc = names(await listCapturePage(lab(), { ...base, sort: "thd", dir: "asc" }));
    expect(asc.slice(0, 3)).toEqual([`${tag}-0.csv`, `${tag}-2.csv`, `${tag}-1.csv`]);
    expect(asc.slice(3).sort()).toEqual([`${tag}-3.csv`, `${tag}-4.csv`]);
    expect(names(await listCapturePage(lab(), { ...base, sort: "ke", dir: "asc" }))[0]).toBe(`${tag}-2.csv`);
    expect(names(await listCapturePage(lab(), { ...base, limit: 2, offset: 2 }))).toEqual([`${tag}-2.csv`, `${tag}-1.csv`]);
  });

  it("pages a figure sort across the end of the judged captures into the unjudged, newest first", async () => {
    const page = (offset: number) => listCapturePage(lab(), { ...base, sort: "thd", dir: "desc", limit: 2, offset }).then(names);
    expect(await page(0)).toEqual([`${tag}-1.csv`, `${tag}-2.csv`]);
    expect(await page(2)).toEqual([`${tag}-0.csv`, `${tag}-4.csv`]);
    expect(await page(4)).toEqual([`${tag}-3.csv`]);
    expect(await page(6)).toEqual([]);
  });

  it("shows a client its own units' captures and nothing of another client", async () => {
    expect(await listCapturePage({ kind: "manufacturer", organisationId: kestrumId }, base)).toHaveLength(5);
    expect(await listCapturePage({ kind: "manufacturer", organisationId: poldaneId }, base)).toHaveLength(0);
  });
});

describe("listCapturePage from a place (keyset paging)", () => {
  // Nine captures of one unit; four share one capture time to the microsecond, two another, so the id
  // must break the ties and a cursor must keep the microseconds a JavaScript Date would drop.
  const times = ["10:00:00.000001", "10:00:00.123456", "10:00:00.123456", "10:00:00.123456", "10:00:00.123456", "10:00:00.123457",
    "10:00:01.500000", "10:00:01.500000", "10:00:02.000000"];
  const serial = `${tag.replace("CL", "KP")}-K`; // not matched by the other tests' search
  beforeAll(async () => {
    const rating = (await getDb().select().from(ratings).where(eq(ratings.organisationId, kestrumId)).limit(1))[0]!;
    const unit = await insertUnitOnce({ kind: "lab", labId }, { serial, ratingId: rating.id, organisationId: kestrumId });
    for (const [i, t] of times.entries()) {
      await getDb().insert(captures).values({
        unitId: unit.id, labId, testKind: "no-load", originalName: `${tag}-k${i}.csv`, objectKey: `test/${tag}/k${i}`, sizeBytes: 100,
        sha256: `${tag}-k${i}`.padEnd(64, "1"), state: "rejected", createdAt: sql`${`2026-01-05 ${t}+00`}::timestamptz` as unknown as Date,
      });
    }
  });

  const walk = async (dir: "asc" | "desc", size: number) => {
    const filter: CaptureListFilter = { search: serial, sort: "captured", dir, limit: size, offset: 0 };
    const whole = await listCapturePage(lab(), { ...filter, limit: 100 });
    expect(whole).toHaveLength(times.length);
    // Forward from the first page by the last row's place, then back from the end by the first row's.
    const pages = [await listCapturePage(lab(), filter)];
    while (pages.at(-1)!.length === size) pages.push(await listCapturePage(lab(), { ...filter, after: placeOf(pages.at(-1)!.at(-1)!.place) }));
    const back = [pages.findLast((p) => p.length > 0)!];
    while (back[0]!.length > 0 && back[0]![0]!.id !== whole[0]!.id) back.unshift(await listCapturePage(lab(), { ...filter, before: placeOf(back[0]![0]!.place) }));
    return { whole: names(whole), forward: names(pages.flat()), backward: names(back.flat()), pageCount: pages.length };
  };

  it("walks newest first and oldest first, forward and back, without skipping or repeating a row among equal times", async () => {
    for (const dir of ["desc", "asc"] as const) {
      for (const size of [1, 2, 3, 4]) {
        const { whole, forward, backward } = await walk(dir, size);
        expect(forward, `${dir} by ${size}`).toEqual(whole);
        expect(backward, `${dir} by ${size}, back`).toEqual(whole);
      }
    }
    const { whole } = await walk("desc", 3);
    expect(whole[0]).toBe(`${tag}-k8.csv`);
    expect(whole.at(-1)).toBe(`${tag}-k0.csv`);
  });

  it("gives the same page by place as by offset", async () => {
    const filter: CaptureListFilter = { search: serial, sort: "captured", dir: "desc", limit: 3, offset: 0 };
    const first = await listCapturePage(lab(), filter);
    expect(names(await listCapturePage(lab(), { ...filter, after: placeOf(first.at(-1)!.place) })))
      .toEqual(names(await listCapturePage(lab(), { ...filter, offset: 3 })));
  });
});

describe("captureListQuerySchema", () => {
  it("reads a query string with defaults, and refuses unknown sorts and states", () => {
    expect(captureListQuerySchema.parse({})).toEqual({ sort: "captured", dir: "desc", page: 1 });
    expect(captureListQuerySchema.parse({ q: " KG45 ", state: "queued", sort: "thd", dir: "asc", page: "3", kind: "" })).toMatchObject({ q: "KG45", state: "queued", sort: "thd", dir: "asc", page: 3 });
    expect(captureListQuerySchema.safeParse({ sort: "price" }).success).toBe(false);
    expect(captureListQuerySchema.safeParse({ state: "lost" }).success).toBe(false);
    expect(captureListQuerySchema.safeParse({ page: "0" }).success).toBe(false);
    const place = "2026-01-05T10:00:00.123456Z~0b7e3f4a-1c2d-4e5f-8a9b-0c1d2e3f4a5b";
    expect(captureListQuerySchema.parse({ after: place }).after).toBe(place);
    for (const bad of ["2026-01-05T10:00:00Z~0b7e3f4a-1c2d-4e5f-8a9b-0c1d2e3f4a5b", "2026-01-05T10:00:00.123456Z", "'; select 1 --", `${place}x`]) {
      expect(captureListQuerySchema.safeParse({ after: bad }).success, bad).toBe(false);
      expect(captureListQuerySchema.safeParse({ before: bad }).success, bad).toBe(false);
    }
  });
});
