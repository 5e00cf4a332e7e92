import { CaptureRejection } from "./rejection";
import type { QualityWarning } from "./types";

/** What one pass over a time column gathered: first and last stamp, count, and the extreme steps. */
export type TimeStepStats = {
  timeStartS: number;
  timeLastS: number;
  count: number;
  minStep: number;
  minStepLine: number;
  maxStep: number;
  maxStepLine: number;
};

/**
 * Judges a time column as a whole: a step further than `tolerance` (fraction of the mean step) from
 * the mean is a located rejection, more than 1 % is an uneven-sampling warning. Needs count ≥ 2.
 * Returns the sample rate from the mean step.
 */
export function judgeTimeSteps(stats: TimeStepStats, tolerance: number, column: string): { sampleRateHz: number; warnings: QualityWarning[] } {
  const meanStep = (stats.timeLastS - stats.timeStartS) / (stats.count - 1);
  const slow = (stats.maxStep - meanStep) / meanStep;
  const fast = (meanStep - stats.minStep) / meanStep;
  const worst = Math.max(slow, fast);
  const worstLine = slow >= fast ? stats.maxStepLine : stats.minStepLine;
  if (worst > tolerance) {
    throw new CaptureRejection(
      "irregular-time",
      `Irregular time stamps: one step differs from the mean step (${meanStep.toPrecision(6)} s) by ${(100 * worst).toFixed(1)} %, more than the ${(100 * tolerance).toFixed(1)} % allowed (missing samples or a merged record?)`,
      { line: worstLine, column },
    );
  }
  const warnings: QualityWarning[] = [];
  if (worst > 0.01) {
    warnings.push({
      code: "uneven-sampling",
      message: `Time steps vary by up to ${(100 * worst).toFixed(2)} % of the mean step (worst at line ${worstLine}); results assume even sampling`,
    });
  }
  return { sampleRateHz: 1 / meanStep, warnings };
}
