import { and, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { analyses, captures, planSteps, ratings, signInAttempts, units, users, type Unit } from "@/db/schema";
import { hashPassword } from "@/lib/auth/password";
import { run } from "./ratings-support";

// Fixtures for the disposition, review and note tests: units with the facts the rules read, captures with
// stored verdicts (inserted directly, as a finished analysis would leave them) and a signer of their own.

let counter = 0;

/** The demo password; the signers made here use it too. */
export const PASSWORD = "bench-demo-2026";

export async function seededRating(labId: string, modelCode: string) {
  const [row] = await getDb().select().from(ratings).where(and(eq(ratings.labId, labId), eq(ratings.modelCode, modelCode))).limit(1);
  if (!row) throw new Error(`the test database lacks the seeded rating ${modelCode}: run the test command, which seeds it`);
  const steps = await getDb().select().from(planSteps).where(eq(planSteps.ratingId, row.id)).orderBy(planSteps.position);
  return { rating: row, steps };
}

export async function makeUnit(rating: { id: string; labId: string; organisationId: string }, facts: Partial<Pick<Unit, "disposition" | "planState" | "latestOverall" | "latestCaptureAt">>) {
  counter += 1;
  const [row] = await getDb().insert(units).values({
    serial: `DSP-${run}-${counter}`, ratingId: rating.id, organisationId: rating.organisationId, labId: rating.labId,
    disposition: facts.disposition ?? "open", planState: facts.planState ?? "incomplete", latestOverall: facts.latestOverall ?? null,
    latestCaptureAt: facts.latestCaptureAt ?? null,
  }).returning();
  if (!row) throw new Error("unit not inserted");
  return row;
}

export type StoredVerdict = { check: string; label: string; measured: number | string | null; unit: string; lower: number | null; upper: number | null; status: string; reason?: string | null; basis: string; source: string };

/** An analysed capture of the unit with a current analysis holding these verdicts, judged for `planStepId`. */
export async function makeAnalysedCapture(unit: Unit, values: { planStepId: string | null; overall: "pass" | "fail" | "inconclusive" | "marginal"; verdicts: StoredVerdict[]; createdAt: Date; uploadedById?: string }) {
  counter += 1;
  const [capture] = await getDb().insert(captures).values({
    unitId: unit.id, labId: unit.labId, testKind: "no-load", speedRpm: 1500, planStepId: values.planStepId, originalName: `dsp-${run}-${counter}.csv`,
    objectKey: `test/dispositions/${run}/${counter}.csv`, sizeBytes: 100, sha256: `${run}-${counter}`.padEnd(64, "0"), state: "analysed",
    createdAt: values.createdAt, uploadedById: values.uploadedById ?? null,
  }).returning();
  if (!capture) throw new Error("capture not inserted");
  await getDb().insert(analyses).values({
    captureId: capture.id, analysisVersion: "2.1.0", toleranceDigest: `test-${counter}`, planStepId: values.planStepId, overall: values.overall,
    report: { verdicts: values.verdicts, overall: values.overall, warnings: [], channels: [], backEmf: null, threePhase: null, power: null },
  });
  return capture;
}

/** A quality engineer of the lab of one's own, so counted password failures touch no seeded account. */
export async function makeSigner(labId: string, tag: string) {
  const email = `signer-${tag}-${run}@harrowgate.example`;
  const [row] = await getDb().insert(users).values({ email, name: `Signer ${tag} ${run}`, role: "qa", organisationId: labId, passwordHash: await hashPassword(PASSWORD) }).returning();
  if (!row) throw new Error("signer not inserted");
  return row;
}

export async function failuresOf(email: string) {
  return getDb().select().from(signInAttempts).where(eq(signInAttempts.email, email.toLowerCase()));
}
