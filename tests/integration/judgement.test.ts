import { and, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db/client";
import { getCurrentAnalysis, listAnalysisHistory } from "@/db/queries/analyses";
import { findActiveUserByEmail } from "@/db/queries/users";
import { planSteps, ratings, toleranceProfiles, units } from "@/db/schema";
import { demoUsers } from "@/db/seed-data";
import { profileFromPreset, speedWindow, type AnalysisReport, type Rating } from "@/lib/analysis";
import { actorForStoredUser } from "@/lib/dal/actor";
import { correctCapture } from "@/lib/dal/capture-corrections";
import { requestRejudge } from "@/lib/dal/rejudge";
import { setStepRecord } from "@/lib/dal/unit-plan";
import { makeThreePhaseCsv } from "@/tests/fixtures/pipeline/make-capture";
import { closeConnections, demoLabStation, registerViaApi, startWorker, uploadViaApi, waitForState, type WorkerProcess } from "./pipeline-support";

// Judgement a lab can sign, through the real pipeline: plausibility and a correction, the plan and its
// capture of record, re-judging after a profile edit, and the inconclusive rules on real files.

let worker: WorkerProcess;
let labId: string;
let token: string;
let ratingId: string;
const run = Date.now() % 100000;
const nameplate: Rating = { machineKind: "wound-field-alternator", nominalVoltageV: 400, voltageBasis: "line-line-rms", frequencyHz: 50, phases: 3, connection: "star", poles: 4, ratedSpeedRpm: 1500, ratedKva: 45 };
const ALL = ["voltage", "frequency", "thd", "individual-harmonic", "voltage-unbalance", "phase-displacement", "phase-sequence", "deviation-factor", "pole-count"] as const;

async function actorFor(role: "qa" | "operator") {
  const row = await findActiveUserByEmail(demoUsers.find((u) => u.role === role)!.email);
  const { passwordHash: _h, ...user } = row!;
  void _h;
  return (await actorForStoredUser(user.id));
}

async function newUnit(serial: string) {
  const [unit] = await getDb().select().from(units).where(and(eq(units.labId, labId), eq(units.serial, serial)));
  if (unit) return unit;
  const [rating] = await getDb().select().from(ratings).where(eq(ratings.id, ratingId));
  const [created] = await getDb().insert(units).values({ serial, ratingId, organisationId: rating!.organisationId, labId }).returning();
  return created!;
}

async function analysed(csv: string, meta: Record<string, unknown>) {
  const { id } = await uploadViaApi(token, csv, { testKind: "no-load", speedRpm: 1500, ...meta });
  const capture = await waitForState(labId, id, ["analysed", "rejected", "failed"]);
  return { id, capture, analysis: await getCurrentAnalysis({ kind: "lab", labId }, id) };
}

const planStateOf = async (unitId: string) => (await getDb().select({ s: units.planState }).from(units).where(eq(units.id, unitId)))[0]?.s;

beforeAll(async () => {
  ({ labId, token } = await demoLabStation());
  // A rating of this file's own, so its profile can be edited without touching the demo's.
  const [kestrum] = await getDb().select({ id: ratings.organisationId }).from(ratings).where(eq(ratings.labId, labId)).limit(1);
  const [rating] = await getDb().insert(ratings).values({ organisationId: kestrum!.id, labId, modelCode: `JT-${run}`, title: "Judgement test alternator", nameplate }).returning();
  ratingId = rating!.id;
  await getDb().insert(toleranceProfiles).values({ ratingId, version: 1, profile: profileFromPreset("iec-60034-1", nameplate), reason: "test" });
  await getDb().insert(planSteps).values({ ratingId, position: 0, name: "Open circuit at rated speed", testKind: "no-load", ...speedWindow(1500, 2), requiredRoles: [], checks: [...ALL] });
  worker = await startWorker();
}, 120_000);

afterAll(async () => {
  await worker?.stop();
  await closeConnections();
});

describe("plausibility and correction", () => {
  it("a 400 V set recorded at 1:100 is inconclusive with the probe ratio named; correcting the ratio gives 400 V within, the first result kept", async () => {
    const unit = await newUnit(`JT${run}-P`);
    // 230.94 V line-neutral is 400 V line-line; written a hundred times too small (probe ratio not applied).
    const { id, capture, analysis } = await analysed(makeThreePhaseCsv({ phaseRmsV: 2.3094, variant: run }), { unitSerial: unit.serial });
    expect(capture.state).toBe("analysed");
    const report = analysis!.report as AnalysisReport;
    expect(report.overall).toBe("inconclusive");
    const alert = report.warnings.find((w) => w.code === "implausible-voltage");
    expect(alert?.message).toMatch(/probe ratio/i);
    expect(report.verdicts.find((v) => v.check === "voltage")!.status).toBe("inconclusive");

    const scales = { "V_AN (V)": 100, "V_BN (V)": 100, "V_CN (V)": 100 };
    // Sending the same file again with the ratio returns the stored capture and names what differs.
    const again = await registerViaApi(token, makeThreePhaseCsv({ phaseRmsV: 2.3094, variant: run }), { unitSerial: unit.serial, speedRpm: 1500, probeScales: scales });
    expect(again.status).toBe(200);
    expect((again.body as { settingsDiffer?: Record<string, unknown> }).settingsDiffer).toHaveProperty("probeScales");
    const operator = await actorFor("operator");
    await correctCapture(operator, id, { probeScales: scales, reason: "100:1 probes fitted, recorded at 1:1" });
    await expect(correctCapture(operator, id, { probeScales: scales, reason: "again while it runs" })).rejects.toThrow(/still being uploaded or analysed|already has/);
    await waitForState(labId, id, ["analysed", "rejected", "failed"]);
    const after = (await getCurrentAnalysis({ kind: "lab", labId }, id))!.report as AnalysisReport;
    const voltage = after.verdicts.find((v) => v.check === "voltage")!;
    // √3 × 230.94 = 400.0 V (DOMAIN §6, line-line from line-neutral).
    expect(voltage.measured as number).toBeCloseTo(400, 0);
    expect(voltage.status).toBe("pass");
    expect(after.warnings.some((w) => w.code === "implausible-voltage")).toBe(false);
    const history = await listAnalysisHistory({ kind: "lab", labId }, id);
    expect(history.length).toBe(2);
    expect(history.filter((h) => h.current).length).toBe(1);
  }, 120_000);
});

describe("test plan and capture of record", () => {
  it("a unit is complete when its step's latest capture passes, failed when a later one fails, complete again when QA chooses the passing one", async () => {
    const unit = await newUnit(`JT${run}-C`);
    const good = await analysed(makeThreePhaseCsv({ fifth: 0.01, variant: run + 1 }), { unitSerial: unit.serial });
    expect(good.analysis!.overall).toBe("pass");
    expect(good.analysis!.planStepId).not.toBeNull();
    expect(await planStateOf(unit.id)).toBe("complete-within");
    // A 5 % fifth harmonic fails the 3 % single-harmonic limit (lab's own, common practice).
    const bad = await analysed(makeThreePhaseCsv({ fifth: 0.05, variant: run + 2 }), { unitSerial: unit.serial });
    expect(bad.analysis!.overall).toBe("fail");
    expect(await planStateOf(unit.id)).toBe("failed");
    const qa = await actorFor("qa");
    const stepId = good.analysis!.planStepId!;
    await setStepRecord(qa, { unitId: unit.id, planStepId: stepId, captureId: good.id, reason: "the second run had a loose neutral clamp" });
    expect(await planStateOf(unit.id)).toBe("complete-within");
    await expect(setStepRecord(await actorFor("operator"), { unitId: unit.id, planStepId: stepId, captureId: good.id, reason: "not my call" })).rejects.toThrow(/quality engineers/);
  }, 120_000);

  it("a capture outside every step's speed window counts for no step, so the unit stays incomplete", async () => {
    const unit = await newUnit(`JT${run}-S`);
    const off = await analysed(makeThreePhaseCsv({ variant: run + 3 }), { unitSerial: unit.serial, speedRpm: 1400 });
    expect(off.analysis!.planStepId).toBeNull();
    expect(await planStateOf(unit.id)).toBe("incomplete");
  }, 60_000);
});

describe("re-judging after a profile edit", () => {
  it("a tightened THD limit re-judges the stored figures to outside; the earlier verdict stays with its profile version", async () => {
    const unit = await newUnit(`JT${run}-R`);
    const first = await analysed(makeThreePhaseCsv({ fifth: 0.02, variant: run + 4 }), { unitSerial: unit.serial });
    expect(first.analysis!.overall).toBe("pass");
    const v1 = first.analysis!.profileVersionId;
    const profile = profileFromPreset("iec-60034-1", nameplate);
    profile.checks.thd = { required: true, source: { document: "Lab's own limit", clause: "", verified: true }, maxPercent: 1 };
    await getDb().insert(toleranceProfiles).values({ ratingId, version: 2, profile, reason: "client asked for 1 % THD" });
    const outcome = await requestRejudge(await actorFor("qa"), { ratingId });
    expect(outcome.rejudged).toBeGreaterThanOrEqual(1);
    const now = await getCurrentAnalysis({ kind: "lab", labId }, first.id);
    expect(now!.kind).toBe("rejudge");
    expect(now!.overall).toBe("fail");
    expect(now!.profileVersionId).not.toBe(v1);
    const history = await listAnalysisHistory({ kind: "lab", labId }, first.id);
    expect(history.map((h) => h.profileVersion).sort()).toEqual([1, 2]);
    expect(await planStateOf(unit.id)).toBe("failed");
    await expect(requestRejudge(await actorFor("operator"), { ratingId })).rejects.toThrow(/quality engineers/);
  }, 120_000);
});

describe("inconclusive and rejected files", () => {
  it("a file of samples around 1e200 is rejected with the column named, never passed", async () => {
    const unit = await newUnit(`JT${run}-H`);
    const { capture } = await analysed(makeThreePhaseCsv({ phaseRmsV: 1e200, variant: run + 5 }), { unitSerial: unit.serial });
    expect(capture.state).toBe("rejected");
    expect(capture.stateMessage).toMatch(/column "V_[ABC]N \(V\)"/);
  }, 60_000);

  it("a file of samples around 1e-320 is rejected, never passed with THD 0", async () => {
    const unit = await newUnit(`JT${run}-T`);
    const csv = makeThreePhaseCsv({ variant: run + 6 }).split("\n").map((line) => (/^\d/.test(line) ? line.split(",").map((c, i) => (i === 0 ? c : "1e-320")).join(",") : line)).join("\n");
    const { capture } = await analysed(csv, { unitSerial: unit.serial });
    expect(capture.state).toBe("rejected");
  }, 60_000);

  it("a clipped capture is inconclusive on THD and the single harmonic, never a firm verdict", async () => {
    const unit = await newUnit(`JT${run}-K`);
    const peak = 230.94 * Math.SQRT2 * 0.9;
    const csv = makeThreePhaseCsv({ variant: run + 7 }).split("\n").map((line) => (/^\d/.test(line) ? line.split(",").map((c, i) => (i === 0 ? c : Math.max(-peak, Math.min(peak, Number(c))).toFixed(4))).join(",") : line)).join("\n");
    const { analysis } = await analysed(csv, { unitSerial: unit.serial });
    const report = analysis!.report as AnalysisReport;
    expect(report.verdicts.find((v) => v.check === "thd")!.status).toBe("inconclusive");
    expect(report.verdicts.find((v) => v.check === "individual-harmonic")!.status).toBe("inconclusive");
    expect(report.overall).toBe("inconclusive");
  }, 60_000);

  it("a capture of too few cycles is inconclusive on the checks that need whole cycles", async () => {
    const unit = await newUnit(`JT${run}-F`);
    const { analysis } = await analysed(makeThreePhaseCsv({ cycles: 3, variant: run + 8 }), { unitSerial: unit.serial });
    const report = analysis!.report as AnalysisReport;
    expect(report.warnings.some((w) => w.code === "few-cycles")).toBe(true);
    expect(report.verdicts.find((v) => v.check === "thd")!.status).toBe("inconclusive");
    expect(report.overall).toBe("inconclusive");
  }, 60_000);
});

describe("new serials", () => {
  it("registering a new serial without confirming it is refused with the close matches named", async () => {
    const csv = makeThreePhaseCsv({ variant: run + 9 });
    const res = await registerViaApi(token, csv, { unitSerial: "KG45-26O301", newUnitRatingId: ratingId, speedRpm: 1500 });
    expect(res.status).toBe(422);
    expect(res.body.error).toMatch(/KG45-260301/);
  });
});
