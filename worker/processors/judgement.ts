import { getProfileInForce, listActivePlanSteps } from "@/db/queries/judgement";
import type { Capture, Rating } from "@/db/schema";
import { matchPlanStep } from "@/lib/analysis";
import { ConfigurationProblem, type Judgement } from "./run-analysis";

/** The rating's profile in force and the plan step the capture counts for. */
export async function loadJudgement(rating: Rating, capture: Pick<Capture, "testKind" | "speedRpm" | "planStepId">): Promise<Judgement> {
  const [profile, steps] = await Promise.all([getProfileInForce(rating.id), listActivePlanSteps(rating.id)]);
  if (!profile) throw new ConfigurationProblem(`The rating ${rating.modelCode} has no tolerance profile yet: a lab manager or quality engineer sets one, then the analysis can be re-run`);
  return { rating, profile, step: matchPlanStep(steps, capture) };
}
