import { and, asc, eq, isNull, sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { planSteps, ratings, type PlanStepRow } from "@/db/schema";
import type { PlanStep } from "@/lib/analysis";
import type { Scope } from "./scope";

// A rating's plan steps. A step is retired, never deleted (captures and records may point at it).

type LabScope = Scope & { kind: "lab" };

const ofLabRating = (scope: LabScope, ratingId: string) =>
  and(eq(planSteps.ratingId, ratingId), sql`exists (select 1 from ${ratings} where ${ratings.id} = ${planSteps.ratingId} and ${ratings.labId} = ${scope.labId})`);

export async function listPlanStepsForLab(scope: LabScope, ratingId: string, options: { includeRetired?: boolean } = {}): Promise<PlanStepRow[]> {
  const where = options.includeRetired ? ofLabRating(scope, ratingId) : and(ofLabRating(scope, ratingId), isNull(planSteps.retiredAt));
  return getDb().select().from(planSteps).where(where).orderBy(asc(planSteps.position), asc(planSteps.createdAt));
}

/**
 * Makes the active plan exactly `steps`, in that order: steps with an id are updated, steps without
 * one are added, active steps left out are retired. One transaction. The caller has checked that the
 * rating is the lab's and that every id belongs to its active plan.
 */
export async function replacePlanSteps(scope: LabScope, ratingId: string, steps: ReadonlyArray<PlanStep & { id?: string }>): Promise<PlanStepRow[]> {
  return getDb().transaction(async (tx) => {
    const [rating] = await tx.select({ id: ratings.id }).from(ratings).where(and(eq(ratings.id, ratingId), eq(ratings.labId, scope.labId))).for("update");
    if (!rating) return [];
    const current = await tx.select().from(planSteps).where(and(eq(planSteps.ratingId, ratingId), isNull(planSteps.retiredAt)));
    const keep = new Set(steps.map((s) => s.id).filter(Boolean));
    for (const old of current) if (!keep.has(old.id)) await tx.update(planSteps).set({ retiredAt: new Date() }).where(eq(planSteps.id, old.id));
    for (const [position, step] of steps.entries()) {
      const values = {
        position, name: step.name, testKind: step.testKind, speedMinRpm: step.speedMinRpm, speedMaxRpm: step.speedMaxRpm, requiredRoles: [...step.requiredRoles], checks: [...step.checks],
      };
      if (step.id) await tx.update(planSteps).set(values).where(and(eq(planSteps.id, step.id), eq(planSteps.ratingId, ratingId)));
      else await tx.insert(planSteps).values({ ratingId, ...values });
    }
    await tx.update(ratings).set({ updatedAt: new Date() }).where(eq(ratings.id, ratingId));
    return tx.select().from(planSteps).where(and(eq(planSteps.ratingId, ratingId), isNull(planSteps.retiredAt))).orderBy(asc(planSteps.position));
  });
}
