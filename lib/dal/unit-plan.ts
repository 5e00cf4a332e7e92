import "server-only";
import { z } from "zod";
import { listActivePlanSteps } from "@/db/queries/judgement";
import { chooseStepRecord, clearStepRecord } from "@/db/queries/step-records";
import { refreshUnitPlanState } from "@/db/queries/unit-plan";
import { TEST_KIND_LABELS } from "@/lib/captures/input-schemas";
import { CHECK_LABELS, type StepStatus } from "@/lib/analysis";
import { HttpError, requireUser } from "@/lib/auth/guards";
import type { Actor } from "./actor";
import { scopeFor } from "./scope";
import { unitCapturesInScope, unitPlanInScope } from "./request-reads";

export const stepRecordSchema = z.object({
  unitId: z.uuid(),
  planStepId: z.uuid(),
  /** Empty: go back to the latest capture judged for the step. */
  captureId: z.union([z.uuid(), z.literal("")]),
  reason: z.string().trim().min(5, "Say why this capture is the record (at least 5 characters)").max(1000),
});

export const STEP_STATUS_WORDS: Record<StepStatus, string> = { passed: "Passed", failed: "Failed", inconclusive: "Inconclusive", missing: "Missing" };

/** Captures a step's record choice offers at most (newest first; a unit can have hundreds). */
export const RECORD_CANDIDATES = 30;

/** The unit page's plan: each step with its window, checks, status, capture of record and the other candidates. */
export async function getUnitPlanView(unitId: string) {
  const user = await requireUser();
  if (!z.uuid().safeParse(unitId).success) return null;
  const scope = scopeFor(user);
  const evaluation = await unitPlanInScope(scope, unitId);
  if (!evaluation) return null;
  const [steps, captures] = await Promise.all([listActivePlanSteps(evaluation.ratingId), unitCapturesInScope(scope, unitId)]);
  const names = new Map(captures.map((c) => [c.id, c.originalName]));
  const byStep = new Map(evaluation.steps.map((s) => [s.stepId, s]));
  return {
    state: evaluation.state,
    keFit: evaluation.keFit,
    canChoose: scope.kind === "lab" && (user.role === "qa" || user.role === "admin"),
    steps: steps.map((step) => {
      const e = byStep.get(step.id);
      return {
        id: step.id, name: step.name, testKind: TEST_KIND_LABELS[step.testKind], speedMinRpm: step.speedMinRpm, speedMaxRpm: step.speedMaxRpm,
        checks: step.checks.map((c) => CHECK_LABELS[c]), status: e?.status ?? "missing", chosen: e?.chosen ?? false,
        record: e?.record ? { id: e.record.captureId, name: names.get(e.record.captureId) ?? "capture", overall: e.record.overall, createdAt: e.record.createdAt.toISOString(), speedRpm: e.record.speedRpm } : null,
        // The latest RECORD_CANDIDATES judged for the step, and the record itself wherever it falls.
        candidates: captures.filter((c) => c.judgedStepId === step.id && c.state === "analysed")
          .filter((c, i) => i < RECORD_CANDIDATES || c.id === e?.record?.captureId)
          .map((c) => ({ id: c.id, name: c.originalName, createdAt: c.createdAt.toISOString(), overall: c.overall })),
      };
    }),
  };
}

/** A quality engineer's choice of a step's capture of record (or back to the latest), with the reason recorded. */
export async function setStepRecord(actor: Actor, input: z.output<typeof stepRecordSchema>): Promise<void> {
  if (actor.scope.kind !== "lab" || (actor.role !== "qa" && actor.role !== "admin") || !actor.userId) throw new HttpError(403, "Only quality engineers and lab managers choose a capture of record");
  const base = { unitId: input.unitId, planStepId: input.planStepId, reason: input.reason, actorId: actor.userId };
  if (input.captureId === "") {
    if (!(await clearStepRecord(actor.scope, base))) throw new HttpError(404, "No choice to undo for that step");
  } else {
    const outcome = await chooseStepRecord(actor.scope, { ...base, captureId: input.captureId });
    if (outcome === "missing") throw new HttpError(404, "No such unit or plan step");
    if (outcome === "not-judged-for-step") throw new HttpError(422, "That capture was not judged for this step: only an analysed capture of the step can be its record");
  }
  await refreshUnitPlanState(actor.scope, input.unitId);
}
