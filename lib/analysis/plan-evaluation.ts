import { KE_BASIS_UNITS, type Rating } from "./rating";
import type { VerdictStatus } from "./report-schema";
import { describeSource, type ToleranceProfile } from "./tolerance";
import { judge } from "./verdicts";

export type StepStatus = "passed" | "failed" | "inconclusive" | "missing";
export type PlanState = "incomplete" | "complete-within" | "failed" | "inconclusive";

/** One analysed capture as the plan sees it: its current result and the step it was judged for. */
export type CaptureResult = {
  captureId: string;
  createdAt: Date;
  speedRpm: number | null;
  /** The step its current analysis was judged for. */
  judgedForStepId: string | null;
  overall: VerdictStatus | null;
  /** Ke in the rating's basis from this capture (null when not a back-EMF capture). */
  ke: number | null;
};

export type StepEvaluation = {
  stepId: string;
  status: StepStatus;
  record: CaptureResult | null;
  /** The record was chosen by a quality engineer rather than being the latest valid capture. */
  chosen: boolean;
};

export type KeFit = {
  /** Least squares through the origin of Ke·n against n: Σ(n_i·V_i)/Σ(n_i²) in the rating's basis. */
  ke: number | null;
  unit: string;
  points: { speedRpm: number; ke: number }[];
  /** Largest |V_i − Ke·n_i| / (Ke·n_i), percent (DOMAIN §11). */
  linearityPercent: number | null;
  status: VerdictStatus;
  lower: number | null;
  upper: number | null;
  source: string;
};

export type PlanEvaluation = { state: PlanState; steps: StepEvaluation[]; keFit: KeFit | null };

const STEP_FROM_OVERALL: Partial<Record<VerdictStatus, StepStatus>> = { pass: "passed", marginal: "passed", fail: "failed" };

/**
 * Fits V = Ke·n through the origin over the back-EMF records at several speeds. Each point's voltage is
 * Ke_i·n_i, so the fit is Σ(n_i²·Ke_i)/Σ(n_i²) and the residual of point i is (Ke_i − Ke)/Ke.
 */
export function fitBackEmfConstant(points: readonly { speedRpm: number; ke: number }[]): { ke: number; linearityPercent: number } | null {
  const usable = points.filter((p) => Number.isFinite(p.ke) && p.speedRpm > 0);
  if (usable.length === 0) return null;
  let sxy = 0;
  let sxx = 0;
  for (const p of usable) {
    const volts = p.ke * p.speedRpm;
    sxy += p.speedRpm * volts;
    sxx += p.speedRpm * p.speedRpm;
  }
  const ke = sxy / sxx;
  if (!(ke > 0)) return null;
  const linearityPercent = Math.max(...usable.map((p) => (100 * Math.abs(p.ke * p.speedRpm - ke * p.speedRpm)) / (ke * p.speedRpm)));
  return { ke, linearityPercent };
}

/**
 * Where a unit stands against its plan: for each step the capture of record (chosen by a quality
 * engineer, else the latest capture judged for the step) and its status; the unit is complete and
 * within only when every step passed, and the Ke fit across back-EMF steps passes where Ke is judged.
 */
export function evaluatePlan(input: {
  steps: readonly { id: string; testKind: string }[];
  results: readonly CaptureResult[];
  chosen: ReadonlyMap<string, string>;
  rating: Rating;
  profile: ToleranceProfile | null;
}): PlanEvaluation {
  const steps = input.steps.map((step): StepEvaluation => {
    const chosenId = input.chosen.get(step.id);
    const forStep = input.results.filter((r) => r.judgedForStepId === step.id);
    const chosenRecord = chosenId ? forStep.find((r) => r.captureId === chosenId) ?? null : null;
    const latest = [...forStep].sort((a, b) => b.createdAt.getTime() - a.createdAt.getTime())[0] ?? null;
    const record = chosenRecord ?? latest;
    const status: StepStatus = record ? (record.overall ? STEP_FROM_OVERALL[record.overall] ?? "inconclusive" : "inconclusive") : "missing";
    return { stepId: step.id, status, record, chosen: chosenRecord !== null };
  });
  const keFit = fitAcrossSteps(input, steps);
  const statuses = new Set(steps.map((s) => s.status));
  let state: PlanState = "complete-within";
  if (steps.length === 0) state = "incomplete";
  else if (statuses.has("failed") || keFit?.status === "fail") state = "failed";
  else if (statuses.has("inconclusive") || keFit?.status === "inconclusive") state = "inconclusive";
  else if (statuses.has("missing")) state = "incomplete";
  return { state, steps, keFit };
}

function fitAcrossSteps(input: Parameters<typeof evaluatePlan>[0], steps: StepEvaluation[]): KeFit | null {
  const { rating, profile } = input;
  const rule = profile?.checks["back-emf-constant"];
  if (!rating.ke || !rule?.required) return null;
  const backEmf = new Set(input.steps.filter((s) => s.testKind === "back-emf").map((s) => s.id));
  const points = steps
    .filter((s) => backEmf.has(s.stepId) && s.record && s.record.ke !== null && s.record.speedRpm !== null)
    .map((s) => ({ speedRpm: s.record?.speedRpm as number, ke: s.record?.ke as number }));
  if (points.length === 0) return null;
  const fit = fitBackEmfConstant(points);
  const nominal = rating.ke.value;
  const lower = nominal * (1 + rule.lowerPercent / 100);
  const upper = nominal * (1 + rule.upperPercent / 100);
  const status = judge(fit?.ke ?? null, { lower, upper, nominal, marginalZonePercent: profile?.marginalZonePercent ?? 10 });
  return { ke: fit?.ke ?? null, unit: KE_BASIS_UNITS[rating.ke.basis], points, linearityPercent: fit?.linearityPercent ?? null, status, lower, upper, source: describeSource(rule.source) };
}
