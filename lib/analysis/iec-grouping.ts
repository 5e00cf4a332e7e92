import { spanFits, spanPhasors } from "./goertzel";
import type { CycleWindow } from "./cycles";

/** Windows averaged: 15 × 10 cycles = the 150-cycle (3 s at 50 Hz) aggregation of IEC 61000-4-30. */
const MAX_WINDOWS = 15;

/**
 * Harmonic groups per IEC 61000-4-7 [S/M]: a rectangular window of 10 cycles (50 Hz systems) or
 * 12 cycles (60 Hz), so spectral lines sit every f1/10 (f1/12); with k = M·h,
 * G_h² = ½C²_{k−M/2} + Σ_{|i|<M/2} C²_{k+i} + ½C²_{k+M/2}. Group RMS values are averaged in power
 * over consecutive windows from the start of the analysis window.
 */
export function computeHarmonicGroups(
  samples: Float64Array,
  sampleRateHz: number,
  frequencyHz: number,
  window: CycleWindow,
  maxOrder: number,
): { order: number; rms: number }[] | null {
  const cyclesPerWindow = frequencyHz < 55 ? 10 : 12;
  const half = cyclesPerWindow / 2;
  const span = (cyclesPerWindow * sampleRateHz) / frequencyHz;
  const windows = Math.min(MAX_WINDOWS, Math.floor(window.cycles / cyclesPerWindow));
  if (windows < 1) return null;
  const orders: number[] = [];
  for (let order = 1; order <= maxOrder && (order * cyclesPerWindow + half) * (frequencyHz / cyclesPerWindow) < sampleRateHz / 2; order++) {
    orders.push(order);
  }
  const lines: number[] = [];
  const weights: number[] = [];
  for (const order of orders) {
    for (let i = -half; i <= half; i++) {
      lines.push(order * cyclesPerWindow + i);
      weights.push(Math.abs(i) === half ? 0.5 : 1);
    }
  }
  const omegas = lines.map((line) => (2 * Math.PI * line * frequencyHz) / cyclesPerWindow / sampleRateHz);
  const energy = new Float64Array(orders.length);
  let used = 0;
  for (let w = 0; w < windows; w++) {
    const start = window.start + Math.round(w * span);
    if (!spanFits(samples.length, start, span)) break;
    const phasors = spanPhasors(samples, start, span, omegas);
    const perOrder = 2 * half + 1;
    for (let o = 0; o < orders.length; o++) {
      let sum = 0;
      for (let j = 0; j < perOrder; j++) {
        const index = o * perOrder + j;
        const re = phasors[2 * index] as number;
        const im = phasors[2 * index + 1] as number;
        sum += (weights[index] as number) * ((re * re + im * im) / 2);
      }
      energy[o] = (energy[o] as number) + sum;
    }
    used++;
  }
  if (used === 0) return null;
  return orders.map((order, o) => ({ order, rms: Math.sqrt((energy[o] as number) / used) }));
}
