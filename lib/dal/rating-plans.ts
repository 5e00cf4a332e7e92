import "server-only";
import { listPlanStepsForLab, replacePlanSteps } from "@/db/queries/plan-steps";
import { getProfileInForce } from "@/db/queries/judgement";
import { listUnitIdsOfRating } from "@/db/queries/ratings";
import { refreshUnitPlanState } from "@/db/queries/unit-plan";
import type { PlanStepRow } from "@/db/schema";
import { CHECK_LABELS, toleranceProfileSchema, type ChannelRole, type CheckId, type PlanStep } from "@/lib/analysis";
import { CHANNEL_ROLE_LABELS, PLAN_TEST_KIND_LABELS } from "@/lib/ratings/labels";
import { planPutSchema } from "@/lib/ratings/input-schemas";
import type { Actor } from "./actor";
import { requireLabRating } from "./ratings";
import { InputError, parseFields, requireSetupEditor } from "./setup-access";

// A rating's test plan. Every change goes through replacePlan (one transaction), then the plan state
// of the rating's units is recomputed.

const rpm = (n: number) => `${Math.round(n * 10) / 10} rpm`;

export function planStepJson(step: PlanStepRow) {
  return {
    id: step.id, position: step.position, name: step.name, testKind: step.testKind, testKindLabel: PLAN_TEST_KIND_LABELS[step.testKind],
    speedMinRpm: step.speedMinRpm, speedMaxRpm: step.speedMaxRpm, speedWindow: `${rpm(step.speedMinRpm)} to ${rpm(step.speedMaxRpm)}`,
    requiredRoles: step.requiredRoles, requiredRoleLabels: step.requiredRoles.map((r) => CHANNEL_ROLE_LABELS[r as ChannelRole] ?? r),
    checks: step.checks, checkLabels: step.checks.map((c) => CHECK_LABELS[c] ?? c),
  };
}

export async function getPlanView(actor: Actor, ratingId: string) {
  const { scope } = await requireLabRating(actor, ratingId);
  return (await listPlanStepsForLab(scope, ratingId)).map(planStepJson);
}

/** The checks the profile in force judges (a step may only use these). */
async function judgedChecks(ratingId: string): Promise<Set<CheckId>> {
  const row = await getProfileInForce(ratingId);
  const profile = row ? toleranceProfileSchema.safeParse(row.profile) : null;
  if (!profile?.success) return new Set();
  return new Set((Object.keys(profile.data.checks) as CheckId[]).filter((id) => profile.data.checks[id].required));
}

/** Makes the plan exactly the steps sent (ids keep a step, no id adds one, a step left out is retired). */
export async function replacePlan(actor: Actor, ratingId: string, raw: unknown, prefix = "steps") {
  const editor = requireSetupEditor(actor);
  const { row } = await requireLabRating(actor, ratingId);
  if (row.rating.retiredAt) throw new InputError({ [prefix]: "This rating is retired: its plan is kept as it was" }, 409);
  const input = parseFields(planPutSchema, raw);
  const current = new Set((await listPlanStepsForLab(editor, ratingId)).map((s) => s.id));
  const judged = await judgedChecks(ratingId);
  const fields: Record<string, string> = {};
  input.steps.forEach((step, i) => {
    if (step.id && !current.has(step.id)) fields[`${prefix}.${i}.id`] = "Not a step of this rating's plan (retired steps stay retired)";
    const unjudged = step.checks.filter((c: CheckId) => !judged.has(c));
    if (unjudged.length) fields[`${prefix}.${i}.checks`] = `The profile in force does not judge ${unjudged.map((c: CheckId) => CHECK_LABELS[c]).join(", ")}`;
  });
  if (Object.keys(fields).length > 0) throw new InputError(fields);
  const steps = await replacePlanSteps(editor, ratingId, input.steps);
  for (const unitId of await listUnitIdsOfRating(editor, ratingId)) await refreshUnitPlanState(editor, unitId);
  return steps.map(planStepJson);
}

type StepEdit = PlanStep & { id?: string };
const asEdit = (s: PlanStepRow): StepEdit => ({
  id: s.id, name: s.name, testKind: s.testKind, speedMinRpm: s.speedMinRpm, speedMaxRpm: s.speedMaxRpm, requiredRoles: s.requiredRoles as ChannelRole[], checks: s.checks,
});

/** Changes one step (or adds one, or retires or moves one) through replacePlan; errors are keyed by the step's own fields. */
export async function changePlanStep(actor: Actor, ratingId: string, change:
  | { kind: "add"; step: unknown } | { kind: "edit"; stepId: string; step: unknown } | { kind: "retire"; stepId: string } | { kind: "move"; stepId: string; by: -1 | 1 }) {
  const editor = requireSetupEditor(actor);
  await requireLabRating(actor, ratingId);
  const steps: unknown[] = (await listPlanStepsForLab(editor, ratingId)).map(asEdit);
  const index = "stepId" in change ? steps.findIndex((s) => (s as StepEdit).id === change.stepId) : -1;
  if ("stepId" in change && index < 0) throw new InputError({ stepId: "Not a step of this rating's plan" }, 404);
  if (change.kind === "add") steps.push(change.step);
  if (change.kind === "edit") steps[index] = { ...(change.step as object), id: change.stepId };
  if (change.kind === "retire") steps.splice(index, 1);
  if (change.kind === "move") {
    const to = index + change.by;
    if (to < 0 || to >= steps.length) return getPlanView(actor, ratingId);
    [steps[index], steps[to]] = [steps[to], steps[index]];
  }
  const at = change.kind === "add" ? steps.length - 1 : index;
  try {
    return await replacePlan(actor, ratingId, { steps });
  } catch (err) {
    // Report the edited step's problems under its own field names ("speedMaxRpm"), as its form names them.
    if (err instanceof InputError) {
      const own = Object.fromEntries(Object.entries(err.fields).filter(([k]) => k.startsWith(`steps.${at}.`)).map(([k, v]) => [k.slice(`steps.${at}.`.length), v]));
      throw new InputError(Object.keys(own).length > 0 ? own : err.fields, err.status);
    }
    throw err;
  }
}
