import type { CycleWindow } from "./cycles";

export type DeviationBasis = "average-cycle" | "worst-cycle";

/** Cycles examined: the deviation is a shape measure, a few dozen cycles settle it. */
const MAX_CYCLES = 50;
const GRID_HALF_WIDTH_RAD = Math.PI / 6;
const GRID_POINTS = 61;
const GOLDEN_ITERATIONS = 40;

/**
 * Waveform deviation factor in percent: F = ΔE_max/E_0 with E_0 = √2·E_rms (AC part) the peak of
 * the equivalent sine and ΔE_max the largest |e(t) − E_0·sin(ωt + φ)|, φ chosen to make it
 * smallest (NEMA MG 1 / IEEE 115 wording [M]). The cost is not smooth in φ: a 1° grid over ±30°
 * about the fundamental's phase, then golden-section search in the best cell. Evaluated per cycle;
 * "average-cycle" reports the mean over the cycles examined, "worst-cycle" the largest.
 */
export function computeDeviationFactor(
  samples: Float64Array,
  sampleRateHz: number,
  frequencyHz: number,
  window: CycleWindow,
  dc: number,
  acRms: number,
  fundamentalPhaseRad: number,
  basis: DeviationBasis,
): number | null {
  if (!(acRms > 0)) return null;
  const peak = Math.SQRT2 * acRms;
  const samplesPerCycle = sampleRateHz / frequencyHz;
  const omega = (2 * Math.PI) / samplesPerCycle;
  // cos(θ + ωn) = sin(ωn + θ + π/2): start from the fundamental's own sine phase.
  const centre = fundamentalPhaseRad + Math.PI / 2;
  const cycles = Math.min(window.cycles, MAX_CYCLES);
  let total = 0;
  let worst = 0;
  for (let cycle = 0; cycle < cycles; cycle++) {
    const first = window.start + Math.ceil(cycle * samplesPerCycle);
    const last = window.start + Math.ceil((cycle + 1) * samplesPerCycle);
    const count = last - first;
    const sines = new Float64Array(count);
    const cosines = new Float64Array(count);
    const values = new Float64Array(count);
    for (let k = 0; k < count; k++) {
      const angle = omega * (first + k - window.start);
      sines[k] = Math.sin(angle);
      cosines[k] = Math.cos(angle);
      values[k] = (samples[first + k] as number) - dc;
    }
    // Stops early once the gap passes `bound`: a grid point that cannot win need not be finished.
    const cost = (phi: number, bound = Number.POSITIVE_INFINITY): number => {
      const c = peak * Math.cos(phi);
      const s = peak * Math.sin(phi);
      let largest = 0;
      for (let k = 0; k < count && largest <= bound; k++) {
        const gap = Math.abs((values[k] as number) - (sines[k] as number) * c - (cosines[k] as number) * s);
        if (gap > largest) largest = gap;
      }
      return largest;
    };
    const step = (2 * GRID_HALF_WIDTH_RAD) / (GRID_POINTS - 1);
    let bestPhi = centre;
    let bestCost = Number.POSITIVE_INFINITY;
    for (let i = 0; i < GRID_POINTS; i++) {
      const phi = centre - GRID_HALF_WIDTH_RAD + i * step;
      const value = cost(phi, bestCost);
      if (value < bestCost) {
        bestCost = value;
        bestPhi = phi;
      }
    }
    const ratio = (Math.sqrt(5) - 1) / 2;
    let low = bestPhi - step;
    let high = bestPhi + step;
    let x1 = high - ratio * (high - low);
    let x2 = low + ratio * (high - low);
    let f1 = cost(x1);
    let f2 = cost(x2);
    for (let i = 0; i < GOLDEN_ITERATIONS; i++) {
      if (f1 <= f2) {
        high = x2;
        x2 = x1;
        f2 = f1;
        x1 = high - ratio * (high - low);
        f1 = cost(x1);
      } else {
        low = x1;
        x1 = x2;
        f1 = f2;
        x2 = low + ratio * (high - low);
        f2 = cost(x2);
      }
    }
    const deviation = Math.min(bestCost, f1, f2) / peak;
    total += deviation;
    if (deviation > worst) worst = deviation;
  }
  return 100 * (basis === "worst-cycle" ? worst : total / cycles);
}
