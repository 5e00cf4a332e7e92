import { getProfileInForce, listActivePlanSteps } from "@/db/queries/judgement";
import type { Capture, PlanStepRow, Rating, ToleranceProfileVersion } from "@/db/schema";
import { matchPlanStep } from "@/lib/analysis";
import { sha256Hex } from "./hash";

// What a capture is judged against, for the worker (analysis) and the web app (re-judging).

/** A problem with the stored rating or profile, not with the capture: retrying cannot help, but it is no rejection either. */
export class ConfigurationProblem extends Error {
  override name = "ConfigurationProblem";
}

/** The rating, its profile version in force and the plan step the capture counts for. */
export type Judgement = { rating: Rating; profile: ToleranceProfileVersion; step: PlanStepRow | null };

/** What the verdicts depended on besides the file: nameplate, profile version and plan step. */
export function toleranceDigest(rating: Rating, profile: ToleranceProfileVersion, step: PlanStepRow | null): string {
  return sha256Hex(JSON.stringify({ nameplate: rating.nameplate, profile: profile.profile, step: step ? { id: step.id, checks: step.checks } : null }));
}

export async function loadJudgement(rating: Rating, capture: Pick<Capture, "testKind" | "speedRpm" | "planStepId">): Promise<Judgement> {
  const [profile, steps] = await Promise.all([getProfileInForce(rating.id), listActivePlanSteps(rating.id)]);
  if (!profile) throw new ConfigurationProblem(`The rating ${rating.modelCode} has no tolerance profile yet: a lab manager or quality engineer sets one, then the analysis can be re-run`);
  return { rating, profile, step: matchPlanStep(steps, capture) };
}
