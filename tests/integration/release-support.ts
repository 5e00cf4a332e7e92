import { createHash, randomUUID } from "node:crypto";
import { and, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { analyses, captures, planSteps, ratings, toleranceProfiles, units } from "@/db/schema";
import { refreshUnitPlanState } from "@/db/queries/unit-plan";
import {
  analyseCapture, computeWaveformEnvelope, parseCaptureText, profileFromPreset, speedWindow, suggestChannelRoles, type Rating, type ToleranceProfile,
} from "@/lib/analysis";
import { makeThreePhaseCsv } from "@/tests/fixtures/pipeline/make-capture";

// Units whose plan is complete without the worker: the engine runs in-process on a synthetic capture
// (the same calls the worker makes) and the capture and its analysis are stored as the worker stores them.

export const nameplate: Rating = {
  machineKind: "wound-field-alternator", nominalVoltageV: 400, voltageBasis: "line-line-rms", frequencyHz: 50, phases: 3, connection: "star", poles: 4, ratedSpeedRpm: 1500, ratedKva: 45,
};
const CHECKS = ["voltage", "frequency", "thd", "individual-harmonic", "voltage-unbalance", "phase-displacement", "phase-sequence", "deviation-factor", "pole-count"] as const;

export type ReleaseRating = { ratingId: string; clientId: string; profileId: string; profile: ToleranceProfile; steps: { id: string; name: string }[] };

/** A rating of the test's own with two no-load plan steps (rated speed and a second window). */
export async function createReleaseRating(labId: string, clientId: string, tag: string): Promise<ReleaseRating> {
  const db = getDb();
  const [rating] = await db.insert(ratings).values({ organisationId: clientId, labId, modelCode: `RL-${tag}`, title: "Release test alternator", nameplate }).returning();
  const profile = profileFromPreset("iec-60034-1", nameplate);
  const [version] = await db.insert(toleranceProfiles).values({ ratingId: rating!.id, version: 1, profile, reason: "test" }).returning();
  const steps = await db.insert(planSteps).values([
    { ratingId: rating!.id, position: 0, name: "Open circuit at rated speed", testKind: "no-load", ...speedWindow(1500, 2), requiredRoles: [], checks: [...CHECKS] },
    { ratingId: rating!.id, position: 1, name: "Open circuit, second run", testKind: "other", ...speedWindow(1500, 2), requiredRoles: [], checks: [...CHECKS] },
  ]).returning();
  return { ratingId: rating!.id, clientId, profileId: version!.id, profile, steps: steps.map((s) => ({ id: s.id, name: s.name })) };
}

export async function createUnit(labId: string, rating: ReleaseRating, serial: string): Promise<string> {
  const [unit] = await getDb().insert(units).values({ serial, ratingId: rating.ratingId, organisationId: rating.clientId, labId }).returning();
  return unit!.id;
}

/** Stores an analysed capture judged for `stepId`, as the worker would after reading `csv`. */
export async function storeAnalysedCapture(labId: string, unitId: string, rating: ReleaseRating, stepId: string, variant: number) {
  const csv = makeThreePhaseCsv({ variant });
  const parsed = parseCaptureText(csv);
  const step = rating.steps.find((s) => s.id === stepId)!;
  const report = analyseCapture(parsed, {
    channelRoles: suggestChannelRoles(parsed.channels.map((c) => c.id)), speedRpm: 1500, poles: nameplate.poles, harmonics: rating.profile.harmonicOrder,
    rating: nameplate, profile: rating.profile, checks: [...CHECKS], stepName: step.name,
  });
  const envelope = computeWaveformEnvelope(parsed, 400);
  const sha = createHash("sha256").update(csv).digest("hex");
  const db = getDb();
  const [capture] = await db.insert(captures).values({
    unitId, labId, testKind: "no-load", speedRpm: 1500, planStepId: stepId, originalName: `run-${variant}.csv`, objectKey: `test-only/${randomUUID()}.csv`,
    sizeBytes: csv.length, sha256: sha, state: "analysed", analysedAt: new Date(),
  }).returning();
  await db.insert(analyses).values({
    captureId: capture!.id, analysisVersion: report.analysisVersion, toleranceDigest: "test", profileVersionId: rating.profileId, planStepId: stepId,
    report, overall: report.overall, frequencyHz: report.frequencyHz, preview: envelope,
    spectrum: { frequencyHz: report.frequencyHz, channels: report.channels.map((c) => ({ id: c.id, role: c.role, unit: c.unit, orders: [1, ...c.harmonics.map((h) => h.order)], rms: [c.fundamental.rms, ...c.harmonics.map((h) => h.rms)] })) },
  });
  await refreshUnitPlanState({ kind: "lab", labId }, unitId);
  return { captureId: capture!.id, report };
}

/** A unit with a capture of record for every step of the rating's plan. */
export async function completeUnit(labId: string, rating: ReleaseRating, serial: string, variant: number): Promise<string> {
  const unitId = await createUnit(labId, rating, serial);
  for (const [i, step] of rating.steps.entries()) await storeAnalysedCapture(labId, unitId, rating, step.id, variant * 10 + i);
  const [row] = await getDb().select({ state: units.planState }).from(units).where(and(eq(units.id, unitId)));
  if (row?.state !== "complete-within") throw new Error(`unit ${serial} is ${row?.state}, not complete-within`);
  return unitId;
}
