import { spanPhasors } from "./goertzel";
import { toDeg, wrapDeg, type Complex } from "./phasors";
import type { CycleWindow } from "./cycles";

export interface HarmonicComponent {
  order: number;
  frequencyHz: number;
  /** RMS of the component, in the channel's SI unit. */
  rms: number;
  /** Phase of A·cos(hωt + φ), referred to the window's first sample, in (−180°, 180°]. */
  phaseDeg: number;
  phasor: Complex;
}

/**
 * Components at orders 1..maxOrder of `frequencyHz` over a whole-cycle window, skipping orders at
 * or above Nyquist. Peak phasor X_h = (2/L)·Σ w_n x_n e^{−jhωn}; rms = |X_h|/√2 (one-sided scaling).
 */
export function computeHarmonics(
  samples: Float64Array,
  sampleRateHz: number,
  frequencyHz: number,
  window: CycleWindow,
  maxOrder: number,
): HarmonicComponent[] {
  const orders: number[] = [];
  for (let order = 1; order <= maxOrder && order * frequencyHz < sampleRateHz / 2; order++) orders.push(order);
  const omegas = orders.map((order) => (2 * Math.PI * order * frequencyHz) / sampleRateHz);
  const phasors = spanPhasors(samples, window.start, window.spanSamples, omegas);
  return orders.map((order, index) => {
    const re = phasors[2 * index] as number;
    const im = phasors[2 * index + 1] as number;
    return {
      order,
      frequencyHz: order * frequencyHz,
      rms: Math.hypot(re, im) / Math.SQRT2,
      phaseDeg: wrapDeg(toDeg(Math.atan2(im, re))),
      phasor: { re, im },
    };
  });
}

/** Highest harmonic order below Nyquist. */
export function highestOrderBelowNyquist(sampleRateHz: number, frequencyHz: number): number {
  return Math.ceil(sampleRateHz / 2 / frequencyHz) - 1;
}
