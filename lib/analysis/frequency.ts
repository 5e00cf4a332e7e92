import { spanFits, spanPhasors } from "./goertzel";
import { largestPowerOfTwoAtMost, realSpectrum } from "./spectrum";

/** Longest stretch handed to the FFT for the coarse estimate (2^16 keeps the table small). */
const COARSE_FFT_MAX = 1 << 16;

export interface ZeroCrossingEstimate {
  frequencyHz: number;
  /** Rising crossings found (one per cycle). */
  crossings: number;
  /** Sample position (fractional) of the first rising crossing. */
  firstCrossing: number;
}

/**
 * Rising zero crossings about `levelOffset` with hysteresis (10 % of `peakAmplitude`) and linear
 * interpolation between the two samples either side. Null with fewer than two crossings.
 */
export function estimateByZeroCrossings(
  samples: Float64Array,
  sampleRateHz: number,
  levelOffset: number,
  peakAmplitude: number,
): ZeroCrossingEstimate | null {
  const hysteresis = 0.1 * peakAmplitude;
  let armed = false;
  let first = -1;
  let last = -1;
  let crossings = 0;
  let previous = (samples[0] as number) - levelOffset;
  for (let n = 1; n < samples.length; n++) {
    const value = (samples[n] as number) - levelOffset;
    if (value < -hysteresis) armed = true;
    else if (armed && value >= 0 && previous < 0) {
      const position = n - 1 + -previous / (value - previous);
      if (first < 0) first = position;
      last = position;
      crossings++;
      armed = false;
    }
    previous = value;
  }
  if (crossings < 2 || !(last > first)) return null;
  return { frequencyHz: ((crossings - 1) * sampleRateHz) / (last - first), crossings, firstCrossing: first };
}

/**
 * Peak of a Hann-windowed FFT over the first power-of-two stretch, refined with the
 * three-bin Hann interpolator δ = (2|X_{k±1}| − |X_k|)/(|X_k| + |X_{k±1}|) [Grandke, IEEE T-IM 1983].
 * Bins below 2 are skipped (DC and the window's own leakage).
 */
export function estimateBySpectrum(samples: Float64Array, sampleRateHz: number, levelOffset: number): number | null {
  if (samples.length < 64) return null;
  const size = largestPowerOfTwoAtMost(Math.min(samples.length, COARSE_FFT_MAX));
  const windowed = new Float64Array(size);
  for (let n = 0; n < size; n++) {
    windowed[n] = ((samples[n] as number) - levelOffset) * (0.5 - 0.5 * Math.cos((2 * Math.PI * n) / size));
  }
  const spectrum = realSpectrum(windowed);
  const magnitude = (k: number): number => Math.hypot(spectrum[2 * k] as number, spectrum[2 * k + 1] as number);
  let peak = -1;
  let peakValue = 0;
  for (let k = 2; k < size / 2; k++) {
    const value = magnitude(k);
    if (value > peakValue) {
      peakValue = value;
      peak = k;
    }
  }
  if (peak < 0 || peakValue === 0) return null;
  const left = magnitude(peak - 1);
  const right = magnitude(peak + 1);
  const delta = right >= left ? (2 * right - peakValue) / (peakValue + right) : -(2 * left - peakValue) / (peakValue + left);
  return ((peak + delta) * sampleRateHz) / size;
}

function wrapRadians(angle: number): number {
  const wrapped = angle - 2 * Math.PI * Math.round(angle / (2 * Math.PI));
  return wrapped;
}

/**
 * Refines a frequency estimate from the phase drift of the fundamental between two adjacent
 * stretches of c whole cycles each: both stretches carry the same window bias, so their phase
 * difference minus the advance expected at the estimate is 2π·Δf·Δt. The baseline grows ×8 per
 * step (each step must keep the drift under half a cycle) up to half the record, then repeats once.
 */
export function refineFrequency(samples: Float64Array, sampleRateHz: number, estimateHz: number): number {
  let frequency = estimateHz;
  let cycles = 2;
  let finalRounds = 0;
  for (let step = 0; step < 40 && finalRounds < 2; step++) {
    const samplesPerCycle = sampleRateHz / frequency;
    const totalCycles = Math.floor(samples.length / samplesPerCycle);
    const maxHalf = Math.floor(totalCycles / 2);
    if (maxHalf < 1) return frequency;
    if (cycles >= maxHalf) {
      cycles = maxHalf;
      finalRounds++;
    }
    const span = cycles * samplesPerCycle;
    const secondStart = Math.round(span);
    if (!spanFits(samples.length, secondStart, span)) return frequency;
    const omega = (2 * Math.PI * frequency) / sampleRateHz;
    const a = spanPhasors(samples, 0, span, [omega]);
    const b = spanPhasors(samples, secondStart, span, [omega]);
    const phaseA = Math.atan2(a[1] as number, a[0] as number);
    const phaseB = Math.atan2(b[1] as number, b[0] as number);
    const drift = wrapRadians(phaseB - phaseA - omega * secondStart);
    frequency += (drift * sampleRateHz) / (2 * Math.PI * secondStart);
    cycles *= 8;
  }
  return frequency;
}
