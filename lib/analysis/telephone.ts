import { thfWeight, tifWeight } from "./telephone-weights";

export interface SpectralLine {
  frequencyHz: number;
  rms: number;
}

/** Upper frequency of the THF sum (IEC 60034-1: harmonics up to 5 kHz) [M]. */
export const THF_BAND_HZ = 5000;

/**
 * Telephone harmonic factor in percent: THF = (100/U)·√Σ(λ_n·U_n)², U the RMS line voltage and
 * U_n the RMS of component n (fundamental included), components up to 5 kHz [IEC 60034-1, M].
 */
export function computeThf(lines: readonly SpectralLine[], totalRms: number): number | null {
  if (!(totalRms > 0)) return null;
  let sum = 0;
  for (const line of lines) {
    if (line.frequencyHz > THF_BAND_HZ) continue;
    const weighted = thfWeight(line.frequencyHz) * line.rms;
    sum += weighted * weighted;
  }
  return (100 * Math.sqrt(sum)) / totalRms;
}

/**
 * Telephone influence factor: TIF = √Σ(W_f·X_f)²/X_rms with the single-frequency weights W_f
 * (5000 at 1 kHz) [M ⚠]. A single 1 % component at 1 kHz gives 50 [D].
 */
export function computeTif(lines: readonly SpectralLine[], totalRms: number): number | null {
  if (!(totalRms > 0)) return null;
  let sum = 0;
  for (const line of lines) {
    const weighted = tifWeight(line.frequencyHz) * line.rms;
    sum += weighted * weighted;
  }
  return Math.sqrt(sum) / totalRms;
}
