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

/** A finished track as plain data (it crosses threads). */
export type TimeTrackSummary = { first: number; last: number; minStep: number; minStepLine: number; maxStep: number; maxStepLine: number };

/**
 * Follows a time column stamp by stamp without storing it: the first and latest stamp and the
 * smallest and largest step with the line of each. Shared by the single pass, each parallel range
 * and the join of ranges, so all three take their extremes the same way.
 */
export class TimeTrack {
  first = Number.NaN;
  last = Number.NaN;
  minStep = Number.POSITIVE_INFINITY;
  minStepLine = 0;
  maxStep = 0;
  maxStepLine = 0;
  private seen = false;

  /** Takes the next stamp; false (and nothing recorded) when it does not increase. */
  accept(timeS: number, line: number): boolean {
    if (!this.seen) {
      this.seen = true;
      this.first = timeS;
    } else {
      const step = timeS - this.last;
      if (!(step > 0)) return false;
      this.noteMin(step, line);
      this.noteMax(step, line);
    }
    this.last = timeS;
    return true;
  }

  /** Appends a later, non-empty track whose first stamp is on `firstLine`; false when the seam does not increase. */
  append(later: TimeTrackSummary, firstLine: number): boolean {
    if (!this.accept(later.first, firstLine)) return false;
    this.noteMin(later.minStep, later.minStepLine);
    this.noteMax(later.maxStep, later.maxStepLine);
    this.last = later.last;
    return true;
  }

  stats(count: number): TimeStepStats {
    return { timeStartS: this.first, timeLastS: this.last, count, minStep: this.minStep, minStepLine: this.minStepLine, maxStep: this.maxStep, maxStepLine: this.maxStepLine };
  }

  private noteMin(step: number, line: number): void {
    if (step < this.minStep) {
      this.minStep = step;
      this.minStepLine = line;
    }
  }

  private noteMax(step: number, line: number): void {
    if (step > this.maxStep) {
      this.maxStep = step;
      this.maxStepLine = line;
    }
  }
}
