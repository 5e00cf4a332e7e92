import { spanWeights } from "./goertzel";
import type { CycleWindow } from "./cycles";

export interface ChannelScan {
  /** Trapezoid-weighted over the whole-cycle window. */
  mean: number;
  meanSquare: number;
  /** Largest |x| inside the window. */
  peak: number;
  /** Runs of identical samples at the record's maximum or minimum, at least `flatRunSamples` long. */
  flatTopRuns: number;
  longestFlatTop: number;
}

/** Flat runs remembered per channel; a clipped record has one per half cycle, far below this. */
const MAX_RECORDED_RUNS = 1 << 16;

/**
 * One pass over a channel for everything that needs every sample: window moments and peak, the
 * record's extremes, and runs of repeated values (kept with their level, so runs at the extremes
 * can be counted once the extremes are known). Fewer passes over 10^7 samples is most of the speed.
 */
export function scanChannel(samples: Float64Array, window: CycleWindow, flatRunSamples: number): ChannelScan {
  const { whole, edges } = spanWeights(samples.length, window.start, window.spanSamples);
  const windowStart = window.start;
  const windowEnd = windowStart + whole;
  const count = samples.length;
  let sum = 0;
  let sumSquares = 0;
  let peak = 0;
  let max = Number.NEGATIVE_INFINITY;
  let min = Number.POSITIVE_INFINITY;
  // Plain locals only (no closure captures them): captured variables live on the heap and
  // made this loop ten times slower.
  let previous = Number.NaN;
  let run = 0;
  const runLevels: number[] = [];
  const runLengths: number[] = [];
  for (let n = 0; n < count; n++) {
    const v = samples[n] as number;
    if (n >= windowStart && n < windowEnd) {
      sum += v;
      sumSquares += v * v;
      const magnitude = v < 0 ? -v : v;
      if (magnitude > peak) peak = magnitude;
    }
    if (v > max) max = v;
    if (v < min) min = v;
    if (v === previous) {
      run++;
    } else {
      if (run >= flatRunSamples && runLevels.length < MAX_RECORDED_RUNS) {
        runLevels.push(previous);
        runLengths.push(run);
      }
      previous = v;
      run = 1;
    }
  }
  if (run >= flatRunSamples && runLevels.length < MAX_RECORDED_RUNS) {
    runLevels.push(previous);
    runLengths.push(run);
  }
  for (const { offset, weight } of edges) {
    const v = samples[window.start + offset] as number;
    sum += weight * v;
    sumSquares += weight * v * v;
    const magnitude = Math.abs(v);
    if (weight > 0 && magnitude > peak) peak = magnitude;
  }
  let flatTopRuns = 0;
  let longestFlatTop = 0;
  runLevels.forEach((level, index) => {
    if (level !== max && level !== min) return;
    flatTopRuns++;
    longestFlatTop = Math.max(longestFlatTop, runLengths[index] as number);
  });
  return { mean: sum / window.spanSamples, meanSquare: sumSquares / window.spanSamples, peak, flatTopRuns, longestFlatTop };
}
