import { spanWeights } from "./goertzel";
import type { CycleWindow } from "./cycles";

export interface WindowScan {
  /** Trapezoid-weighted over the whole-cycle window. */
  mean: number;
  meanSquare: number;
  /** Largest |x| inside the window. */
  peak: number;
}

/**
 * One pass over the window for mean, mean square and peak: the only loop that must touch every
 * one of up to 10^7 samples per channel, so it does nothing else.
 */
export function scanWindow(samples: Float64Array, window: CycleWindow): WindowScan {
  const { whole, edges } = spanWeights(samples.length, window.start, window.spanSamples);
  const end = window.start + whole;
  let sum = 0;
  let sumSquares = 0;
  let peak = 0;
  for (let n = window.start; n < end; n++) {
    const v = samples[n] as number;
    sum += v;
    sumSquares += v * v;
    const magnitude = v < 0 ? -v : v;
    if (magnitude > peak) peak = magnitude;
  }
  for (const { offset, weight } of edges) {
    const v = samples[window.start + offset] as number;
    sum += weight * v;
    sumSquares += weight * v * v;
    if (weight > 0 && Math.abs(v) > peak) peak = Math.abs(v);
  }
  return { mean: sum / window.spanSamples, meanSquare: sumSquares / window.spanSamples, peak };
}

/**
 * Runs of identical samples at the maximum or minimum of samples[from, to), at least
 * `flatRunSamples` long: the flat tops of a clipped input. Steady clipping shows on every cycle,
 * so the harmonic window (≤ 2^18 samples) is enough to see it.
 */
export function countFlatTops(samples: Float64Array, from: number, to: number, flatRunSamples: number): { runs: number; longestRun: number } {
  let max = Number.NEGATIVE_INFINITY;
  let min = Number.POSITIVE_INFINITY;
  for (let n = from; n < to; n++) {
    const v = samples[n] as number;
    if (v > max) max = v;
    if (v < min) min = v;
  }
  let runs = 0;
  let longestRun = 0;
  let run = 0;
  let previous = Number.NaN;
  for (let n = from; n < to; n++) {
    const v = samples[n] as number;
    if (v === max || v === min) {
      run = v === previous ? run + 1 : 1;
      if (run === flatRunSamples) runs++;
      if (run > longestRun) longestRun = run;
    } else {
      run = 0;
    }
    previous = v;
  }
  return { runs, longestRun: runs > 0 ? longestRun : 0 };
}
