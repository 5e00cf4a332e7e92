import { spanFits } from "./goertzel";

/** A stretch of whole cycles of the fundamental, possibly ending between two samples. */
export interface CycleWindow {
  start: number;
  /** Length in samples: cycles × sampleRateHz / frequencyHz. */
  spanSamples: number;
  cycles: number;
}

/**
 * The longest run of whole cycles from `start` that fits the record (a span ending between
 * samples reads one sample past its end). Null when not even one cycle fits.
 */
export function wholeCycleWindow(sampleCount: number, sampleRateHz: number, frequencyHz: number, start = 0, maxCycles = Infinity): CycleWindow | null {
  const samplesPerCycle = sampleRateHz / frequencyHz;
  let cycles = Math.min(maxCycles, Math.floor((sampleCount - start) / samplesPerCycle + 1e-6));
  while (cycles >= 1 && !spanFits(sampleCount, start, cycles * samplesPerCycle)) cycles--;
  if (cycles < 1) return null;
  return { start, spanSamples: cycles * samplesPerCycle, cycles };
}
