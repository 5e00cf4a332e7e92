import { and, eq, gt, isNull, sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { analyses, captures, ratings, stepRecords, units, type StoredStepStanding } from "@/db/schema";
import { evaluatePlan, keInBasis, ratingSchema, toleranceProfileSchema, type AnalysisReport, type CaptureResult, type PlanEvaluation } from "@/lib/analysis";
import { getProfileInForce, listActivePlanSteps } from "./judgement";
import { unitScopeWhere, type Scope } from "./scope";

/** A rating's active plan steps the caller has already read (the review queue reads them per rating). */
export type KnownSteps = { ratingId: string; steps: Awaited<ReturnType<typeof listActivePlanSteps>> };

/**
 * The unit's standing against its rating's plan, from its captures' current results and recorded choices.
 * Only the back-EMF part of each report is read (a unit can have hundreds of 20 KB reports).
 */
export async function evaluateUnitPlan(scope: Scope, unitId: string, known?: KnownSteps): Promise<(PlanEvaluation & { ratingId: string }) | null> {
  const db = getDb();
  const [found] = await db.select({ unit: units, rating: ratings }).from(units).innerJoin(ratings, eq(ratings.id, units.ratingId))
    .where(and(eq(units.id, unitId), unitScopeWhere(scope))).limit(1);
  if (!found) return null;
  const nameplate = ratingSchema.safeParse(found.rating.nameplate);
  if (!nameplate.success) return null;
  const basis = nameplate.data.ke?.basis;
  // Reading a part of a report decompresses the whole of it: only a rating with a Ke basis needs it.
  const backEmf = basis ? sql<AnalysisReport["backEmf"] | null>`${analyses.report} -> 'backEmf'` : sql<null>`null`;
  const [steps, profileRow, rows, choices] = await Promise.all([
    known?.ratingId === found.rating.id ? known.steps : listActivePlanSteps(found.rating.id),
    getProfileInForce(found.rating.id),
    db.select({ id: captures.id, createdAt: captures.createdAt, speedRpm: captures.speedRpm, planStepId: analyses.planStepId, overall: analyses.overall, backEmf })
      .from(captures).innerJoin(analyses, and(eq(analyses.captureId, captures.id), eq(analyses.current, true)))
      .where(and(eq(captures.unitId, unitId), eq(captures.state, "analysed"))).limit(1000),
    db.select().from(stepRecords).where(eq(stepRecords.unitId, unitId)),
  ]);
  const profile = profileRow ? toleranceProfileSchema.safeParse(profileRow.profile) : null;
  const results: CaptureResult[] = rows.map((r) => ({
    captureId: r.id, createdAt: r.createdAt, speedRpm: r.speedRpm, judgedForStepId: r.planStepId, overall: r.overall,
    ke: basis ? keInBasis(r.backEmf ?? null, basis) : null,
  }));
  const evaluation = evaluatePlan({
    steps, results, chosen: new Map(choices.map((c) => [c.planStepId, c.captureId])), rating: nameplate.data, profile: profile?.success ? profile.data : null,
  });
  return { ...evaluation, ratingId: found.rating.id };
}

/** What units.plan_standing keeps of an evaluation: each step's status and record. */
export function standingOf(evaluation: PlanEvaluation): StoredStepStanding[] {
  return evaluation.steps.map((s) => ({ stepId: s.stepId, status: s.status, recordCaptureId: s.record?.captureId ?? null, chosen: s.chosen }));
}

/**
 * Recomputes and stores the unit's plan state and standing (after a result, a record choice or a plan
 * change). Returns the standing stored, or null when the unit is not in scope or its rating unreadable.
 */
export async function refreshUnitPlanState(scope: Scope, unitId: string, known?: KnownSteps): Promise<StoredStepStanding[] | null> {
  const evaluation = await evaluateUnitPlan(scope, unitId, known);
  if (!evaluation) return null;
  const standing = standingOf(evaluation);
  await getDb().update(units).set({ planState: evaluation.state, planStanding: standing }).where(and(eq(units.id, unitId), unitScopeWhere(scope)));
  return standing;
}

/**
 * Stores the standing of open units that have none (plan states stored before it was kept), so the
 * review queue reads it. Idempotent: a unit with a standing is skipped. Returns how many were filled.
 */
export async function backfillPlanStandings(batchSize = 100): Promise<number> {
  let filled = 0;
  let after: string | null = null;
  for (;;) {
    const batch: { id: string; labId: string }[] = await getDb().select({ id: units.id, labId: units.labId }).from(units)
      .where(and(isNull(units.planStanding), eq(units.disposition, "open"), isNull(units.retiredAt), after !== null ? gt(units.id, after) : undefined))
      .orderBy(units.id).limit(batchSize);
    for (const unit of batch) {
      if (await refreshUnitPlanState({ kind: "lab", labId: unit.labId }, unit.id)) filled++;
      after = unit.id;
    }
    if (batch.length < batchSize) return filled;
  }
}
