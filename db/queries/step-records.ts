import { and, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { analyses, captures, planSteps, stepRecords, unitEvents, units } from "@/db/schema";
import { unitScopeWhere, type Scope } from "./scope";

/**
 * Makes a capture the record of a unit's plan step (a quality engineer's choice over the latest one), with
 * the reason in the unit's history. The capture must be analysed and judged for that step.
 */
export async function chooseStepRecord(
  scope: Scope,
  input: { unitId: string; planStepId: string; captureId: string; reason: string; actorId: string },
): Promise<"chosen" | "missing" | "not-judged-for-step"> {
  return getDb().transaction(async (tx) => {
    const [unit] = await tx.select({ id: units.id, ratingId: units.ratingId }).from(units).where(and(eq(units.id, input.unitId), unitScopeWhere(scope))).for("update");
    if (!unit) return "missing";
    const [step] = await tx.select({ id: planSteps.id, name: planSteps.name }).from(planSteps).where(and(eq(planSteps.id, input.planStepId), eq(planSteps.ratingId, unit.ratingId))).limit(1);
    if (!step) return "missing";
    const [judged] = await tx.select({ id: captures.id, name: captures.originalName }).from(captures)
      .innerJoin(analyses, and(eq(analyses.captureId, captures.id), eq(analyses.current, true)))
      .where(and(eq(captures.id, input.captureId), eq(captures.unitId, unit.id), eq(captures.state, "analysed"), eq(analyses.planStepId, step.id))).limit(1);
    if (!judged) return "not-judged-for-step";
    await tx.insert(stepRecords).values({ unitId: unit.id, planStepId: step.id, captureId: judged.id, reason: input.reason, chosenById: input.actorId })
      .onConflictDoUpdate({ target: [stepRecords.unitId, stepRecords.planStepId], set: { captureId: judged.id, reason: input.reason, chosenById: input.actorId, createdAt: new Date() } });
    await tx.insert(unitEvents).values({
      unitId: unit.id, actorId: input.actorId, kind: "record-chosen", comment: input.reason,
      detail: { planStepId: step.id, step: step.name, captureId: judged.id, capture: judged.name },
    });
    return "chosen";
  });
}

/** Goes back to the latest capture as the step's record. */
export async function clearStepRecord(scope: Scope, input: { unitId: string; planStepId: string; reason: string; actorId: string }): Promise<boolean> {
  return getDb().transaction(async (tx) => {
    const [unit] = await tx.select({ id: units.id }).from(units).where(and(eq(units.id, input.unitId), unitScopeWhere(scope))).limit(1);
    if (!unit) return false;
    const removed = await tx.delete(stepRecords).where(and(eq(stepRecords.unitId, unit.id), eq(stepRecords.planStepId, input.planStepId))).returning();
    if (removed.length === 0) return false;
    await tx.insert(unitEvents).values({ unitId: unit.id, actorId: input.actorId, kind: "record-cleared", comment: input.reason, detail: { planStepId: input.planStepId } });
    return true;
  });
}
