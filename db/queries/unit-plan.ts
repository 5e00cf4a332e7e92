import { and, eq, sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { analyses, captures, ratings, stepRecords, units } from "@/db/schema";
import { evaluatePlan, keInBasis, ratingSchema, toleranceProfileSchema, type AnalysisReport, type CaptureResult, type PlanEvaluation } from "@/lib/analysis";
import { getProfileInForce, listActivePlanSteps } from "./judgement";
import { unitScopeWhere, type Scope } from "./scope";

/**
 * The unit's standing against its rating's plan, from its captures' current results and recorded choices.
 * Only the back-EMF part of each report is read (a unit can have hundreds of 20 KB reports).
 */
export async function evaluateUnitPlan(scope: Scope, unitId: string): Promise<(PlanEvaluation & { ratingId: string }) | null> {
  const db = getDb();
  const [found] = await db.select({ unit: units, rating: ratings }).from(units).innerJoin(ratings, eq(ratings.id, units.ratingId))
    .where(and(eq(units.id, unitId), unitScopeWhere(scope))).limit(1);
  if (!found) return null;
  const nameplate = ratingSchema.safeParse(found.rating.nameplate);
  if (!nameplate.success) return null;
  const [steps, profileRow, rows, choices] = await Promise.all([
    listActivePlanSteps(found.rating.id),
    getProfileInForce(found.rating.id),
    db.select({ id: captures.id, createdAt: captures.createdAt, speedRpm: captures.speedRpm, planStepId: analyses.planStepId, overall: analyses.overall, backEmf: sql<AnalysisReport["backEmf"] | null>`${analyses.report} -> 'backEmf'` })
      .from(captures).innerJoin(analyses, and(eq(analyses.captureId, captures.id), eq(analyses.current, true)))
      .where(and(eq(captures.unitId, unitId), eq(captures.state, "analysed"))).limit(1000),
    db.select().from(stepRecords).where(eq(stepRecords.unitId, unitId)),
  ]);
  const profile = profileRow ? toleranceProfileSchema.safeParse(profileRow.profile) : null;
  const basis = nameplate.data.ke?.basis;
  const results: CaptureResult[] = rows.map((r) => ({
    captureId: r.id, createdAt: r.createdAt, speedRpm: r.speedRpm, judgedForStepId: r.planStepId, overall: r.overall,
    ke: basis ? keInBasis(r.backEmf ?? null, basis) : null,
  }));
  const evaluation = evaluatePlan({
    steps, results, chosen: new Map(choices.map((c) => [c.planStepId, c.captureId])), rating: nameplate.data, profile: profile?.success ? profile.data : null,
  });
  return { ...evaluation, ratingId: found.rating.id };
}

/** Recomputes and stores the unit's plan state (after a result, a record choice or a plan change). */
export async function refreshUnitPlanState(scope: Scope, unitId: string): Promise<void> {
  const evaluation = await evaluateUnitPlan(scope, unitId);
  if (!evaluation) return;
  await getDb().update(units).set({ planState: evaluation.state }).where(and(eq(units.id, unitId), unitScopeWhere(scope)));
}
