import { createHash, randomUUID } from "node:crypto";
import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { getDb } from "@/db/client";
import { backfillAnalysisFigures } from "@/db/queries/analysis-figures";
import { getCurrentAnalysis, recordAnalysis, recordRejudgement } from "@/db/queries/analyses";
import { analysisFigures, captureInstruments, captures, instruments, planSteps, ratings, stations, stepRecords, toleranceProfiles, units, users } from "@/db/schema";
import { analyseCapture, createCaptureParser, judgeReport, profileFromPreset, speedWindow, summariseSeries, type AnalysisReport, type Rating } from "@/lib/analysis";
import type { SessionUser } from "@/lib/auth/options";
import { getTrendCsv, getTrendView } from "@/lib/dal/trends";
import { trendQuerySchema } from "@/lib/trends/query";
import { GET as exportRoute } from "@/app/(app)/trends/export/route";
import { makeThreePhaseCsv } from "@/tests/fixtures/pipeline/make-capture";
import { closeConnections } from "./pipeline-support";
import { run, SEEDED, sessionUserOf } from "./ratings-support";

// The trend query over analysis_figures: the figure of record per unit, filters, flagged points left
// out of the statistics, rows replaced on re-judging and backfilled, and the lab's scope.

const session = vi.hoisted(() => ({ current: null as SessionUser | null }));
vi.mock("next-auth", async (original) => ({ ...(await original<object>()), getServerSession: async () => (session.current ? { user: session.current } : null) }));

const nameplate: Rating = { machineKind: "wound-field-alternator", nominalVoltageV: 400, voltageBasis: "line-line-rms", frequencyHz: 50, phases: 3, connection: "star", poles: 4, ratedSpeedRpm: 1500, ratedKva: 45 };
const profile = profileFromPreset("lab-own", nameplate);
const CHECKS = ["voltage", "frequency", "thd", "individual-harmonic", "voltage-unbalance"] as const;
let labId: string;
let ratingId: string;
let stepId: string;
let benchId: string;
let profileId: string;
let qa: SessionUser;
const q = (extra: Record<string, string> = {}) => trendQuerySchema.parse({ rating: ratingId, figure: "voltage", ...extra });

async function unit(serial: string) {
  const [rating] = await getDb().select().from(ratings).where(eq(ratings.id, ratingId));
  const [row] = await getDb().insert(units).values({ serial: `TR${run}-${serial}`, ratingId, organisationId: rating!.organisationId, labId }).returning();
  return row!;
}

/** A capture analysed by the engine in-process and stored as the worker stores it. */
async function analysed(unitId: string, shape: { lineV: number; fifth?: number; at: string; forStep?: boolean; bench?: boolean; kind?: "no-load" | "load" }) {
  const csv = makeThreePhaseCsv({ phaseRmsV: shape.lineV / Math.sqrt(3), fifth: shape.fifth ?? 0.01, variant: Math.round(shape.lineV * 1000) });
  const [capture] = await getDb().insert(captures).values({
    unitId, labId, testKind: shape.kind ?? "no-load", speedRpm: 1500, planStepId: shape.forStep === false ? null : stepId, stationId: shape.bench ? benchId : null,
    originalName: "trend.csv", objectKey: `trend-test/${randomUUID()}`, sizeBytes: csv.length, sha256: createHash("sha256").update(`${randomUUID()}`).digest("hex"),
    state: "queued", createdAt: new Date(shape.at),
  }).returning();
  const parser = createCaptureParser();
  parser.push(new TextEncoder().encode(csv));
  const checks = shape.forStep === false ? undefined : [...CHECKS];
  const report = analyseCapture(parser.finish(), { speedRpm: 1500, poles: 4, rating: nameplate, profile, checks, harmonics: 50 });
  const stored = await recordAnalysis({ kind: "lab", labId }, {
    captureId: capture!.id, analysisVersion: report.analysisVersion, toleranceDigest: `trend-${run}`, profileVersionId: profileId, planStepId: shape.forStep === false ? null : stepId,
    kind: "analysis", report, overall: report.overall, frequencyHz: report.frequencyHz, worstThdPercent: null, vufPercent: null, keLineRmsPerKrpm: null, preview: null, spectrum: null,
  });
  expect(stored).toBe(true);
  return capture!;
}

const units_: Record<string, string> = {};
const caps: Record<string, string> = {};

beforeAll(async () => {
  qa = await sessionUserOf(SEEDED.qa);
  labId = qa.organisationId;
  session.current = qa;
  const [client] = await getDb().select({ id: ratings.organisationId }).from(ratings).where(eq(ratings.labId, labId)).limit(1);
  const [rating] = await getDb().insert(ratings).values({ organisationId: client!.id, labId, modelCode: `TR-${run}`, title: "Trend test alternator", nameplate }).returning();
  ratingId = rating!.id;
  profileId = (await getDb().insert(toleranceProfiles).values({ ratingId, version: 1, profile, reason: "test" }).returning())[0]!.id;
  stepId = (await getDb().insert(planSteps).values({ ratingId, position: 0, name: "Open circuit", testKind: "no-load", ...speedWindow(1500, 2), requiredRoles: [], checks: [...CHECKS] }).returning())[0]!.id;
  benchId = (await getDb().insert(stations).values({ labId, name: `Trend bench ${run}` }).returning())[0]!.id;

  // A..E: one capture each. B on the bench, in March. C: an older capture for the step and a newer one
  // judged for no step (the step's record is the older one). D: chosen record. E: a 1:100 probe (flagged).
  units_.A = (await unit("A")).id; caps.A = (await analysed(units_.A, { lineV: 401, at: "2026-02-10T09:00:00Z" })).id;
  units_.B = (await unit("B")).id; caps.B = (await analysed(units_.B, { lineV: 398, at: "2026-03-05T09:00:00Z", bench: true })).id;
  units_.C = (await unit("C")).id;
  caps.C = (await analysed(units_.C, { lineV: 402, at: "2026-02-12T09:00:00Z" })).id;
  caps.Cnew = (await analysed(units_.C, { lineV: 409, at: "2026-02-20T09:00:00Z", forStep: false })).id;
  units_.D = (await unit("D")).id;
  caps.Dold = (await analysed(units_.D, { lineV: 399, at: "2026-02-14T09:00:00Z" })).id;
  caps.D = (await analysed(units_.D, { lineV: 404, at: "2026-02-16T09:00:00Z" })).id;
  const [who] = await getDb().select({ id: users.id }).from(users).where(eq(users.email, SEEDED.qa));
  await getDb().insert(stepRecords).values({ unitId: units_.D, planStepId: stepId, captureId: caps.Dold, reason: "test", chosenById: who!.id });
  units_.E = (await unit("E")).id; caps.E = (await analysed(units_.E, { lineV: 4.0, at: "2026-02-18T09:00:00Z" })).id;
  // F: only a load capture (test-kind filter).
  units_.F = (await unit("F")).id; caps.F = (await analysed(units_.F, { lineV: 400, at: "2026-02-22T09:00:00Z", kind: "load" })).id;
  // G, in January: a valid capture for the step, then a newer flagged one for it (a 1:100 probe).
  units_.G = (await unit("G")).id;
  caps.G = (await analysed(units_.G, { lineV: 403, at: "2026-01-10T09:00:00Z" })).id;
  caps.Gflagged = (await analysed(units_.G, { lineV: 4.03, at: "2026-01-12T09:00:00Z" })).id;
}, 120_000);

afterAll(closeConnections);

const bySerial = (view: Awaited<ReturnType<typeof getTrendView>>) => Object.fromEntries(view.points.map((p) => [p.serial.replace(`TR${run}-`, ""), p]));

describe("getTrendView: figure of record per unit", () => {
  it("getTrendView returns one point per unit: the step's latest, the chosen record, else the latest valid", async () => {
    const view = await getTrendView(q());
    const points = bySerial(view);
    expect(Object.keys(points).sort()).toEqual(["A", "B", "C", "D", "E", "F", "G"]);
    expect(points.C?.captureId).toBe(caps.C); // the step's record, not the newer unplanned capture
    expect(points.D?.captureId).toBe(caps.Dold); // the quality engineer's choice
    expect(points.G?.captureId).toBe(caps.G); // the step's latest valid, not its newer flagged capture
    expect(points.E?.captureId).toBe(caps.E); // flagged, but the unit has nothing else
    // Voltage is the mean line-line true RMS of a clean synthetic set: 401 V within 0.05 V (construction).
    expect(Math.abs((points.A?.value ?? 0) - 401)).toBeLessThan(0.05);
  });

  it("getTrendView draws flagged points apart and leaves them out of the statistics", async () => {
    const view = await getTrendView(q());
    const points = bySerial(view);
    expect(points.E?.flagged).toBe(true); // implausible voltage alert: 100 times low
    const counted = view.points.filter((p) => !p.flagged).map((p) => p.value);
    expect(view.summary?.n).toBe(6);
    // Same statistics as the pure module over the unflagged points in serial order (lib/analysis/spc.ts, checked against numpy).
    expect(view.summary?.mean).toBeCloseTo(summariseSeries(counted, { lower: view.band!.lower, upper: view.band!.upper })!.mean, 12);
    expect(view.band).toMatchObject({ unit: "V" });
    expect(view.band!.lower! < 400 && view.band!.upper! > 400).toBe(true);
  });

  it("getTrendView filters by date, test kind, bench and instrument", async () => {
    const feb = bySerial(await getTrendView(q({ from: "2026-02-01", to: "2026-02-28" })));
    expect(Object.keys(feb).sort()).toEqual(["A", "C", "D", "E", "F"]);
    const noLoad = bySerial(await getTrendView(q({ kind: "no-load" })));
    expect(noLoad.F).toBeUndefined();
    const bench = bySerial(await getTrendView(q({ bench: benchId })));
    expect(Object.keys(bench)).toEqual(["B"]);
    const [scope] = await getDb().insert(instruments).values({ labId, kind: "oscilloscope", make: "Fenwick", model: "DS-4", serial: `FW${run}`, assetTag: `TR-${run}` }).returning();
    await getDb().insert(captureInstruments).values({ captureId: caps.A!, instrumentId: scope!.id });
    expect(Object.keys(bySerial(await getTrendView(q({ instrument: scope!.id }))))).toEqual(["A"]);
  });

  it("getTrendView takes a single harmonic order from its own rows", async () => {
    const view = await getTrendView(q({ figure: "harmonic", order: "5" }));
    // The fifth is written at 1 % of the fundamental (tests/fixtures/pipeline/make-capture.ts).
    expect(Math.abs((bySerial(view).A?.value ?? 0) - 1)).toBeLessThan(0.01);
  });
});

describe("analysis_figures rows", () => {
  it("recordRejudgement marks the capture's old rows not current and writes the new ones", async () => {
    const current = await getCurrentAnalysis({ kind: "lab", labId }, caps.B!);
    const report = judgeReport(current!.report as AnalysisReport, { rating: nameplate, profile, checks: ["voltage"] });
    const { id: _i, createdAt: _c, current: _k, ...rest } = current!;
    void _i; void _c; void _k;
    expect(await recordRejudgement({ kind: "lab", labId }, { ...rest, report, overall: report.overall, kind: "rejudge" })).toBe(true);
    const rows = await getDb().select().from(analysisFigures).where(eq(analysisFigures.captureId, caps.B!));
    const live = rows.filter((r) => r.current);
    expect(new Set(live.map((r) => r.analysisId)).size).toBe(1);
    expect(live[0]?.analysisId).not.toBe(current!.id);
    expect(rows.filter((r) => !r.current).every((r) => r.analysisId === current!.id)).toBe(true);
    expect(live.find((r) => r.figure === "thd")?.status).toBe("not-required");
  });

  it("backfillAnalysisFigures writes rows for a current analysis without any, and a second run writes none", async () => {
    const current = await getCurrentAnalysis({ kind: "lab", labId }, caps.A!);
    await getDb().delete(analysisFigures).where(eq(analysisFigures.analysisId, current!.id));
    const first = await backfillAnalysisFigures();
    expect(first.rows).toBeGreaterThan(0);
    const rows = await getDb().select().from(analysisFigures).where(and(eq(analysisFigures.analysisId, current!.id), eq(analysisFigures.current, true)));
    expect(rows.find((r) => r.figure === "voltage")?.value).toBeCloseTo(bySerial(await getTrendView(q())).A!.value, 9);
    expect((await backfillAnalysisFigures()).rows).toBe(0);
  });
});

describe("scope and export", () => {
  it("getTrendView answers 404 for another lab's rating", async () => {
    session.current = await sessionUserOf("wren.obuya@calderwick.example");
    try {
      await expect(getTrendView(q())).rejects.toMatchObject({ status: 404 });
      const res = await exportRoute(new Request(`http://test/trends/export?rating=${ratingId}&figure=voltage`));
      expect(res.status).toBe(404);
    } finally {
      session.current = qa;
    }
  });

  it("GET /trends/export gives one CSV row per plotted point, and a 400 naming a bad parameter", async () => {
    const view = await getTrendView(q());
    const res = await exportRoute(new Request(`http://test/trends/export?rating=${ratingId}&figure=voltage`));
    expect(res.status).toBe(200);
    const lines = (await res.text()).trim().split("\r\n");
    expect(lines.length - 1).toBe(view.points.length);
    expect(lines.slice(1).map((l) => l.split(",")[0])).toEqual(view.points.map((p) => p.serial));
    expect((await getTrendCsv(q())).body.split("\r\n")[0]).toMatch(/^serial,measured_at,value/);
    const bad = await exportRoute(new Request(`http://test/trends/export?rating=${ratingId}&figure=volts`));
    expect(bad.status).toBe(400);
    expect(((await bad.json()) as { error: string }).error).toMatch(/^figure:/);
  });
});
