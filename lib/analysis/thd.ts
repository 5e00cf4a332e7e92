/**
 * THD_F = √(Σ_{h≥2} X_h²)/X_1 and THD_R = √(Σ_{h≥2} X_h²)/√(Σ_{h≥1} X_h²) = THD_F/√(1 + THD_F²),
 * both in percent, from component RMS values (IEC 61000-4-7 / IEEE 519 definitions).
 * Null when the fundamental is zero: distortion of nothing is not computable.
 */
export function computeThd(fundamentalRms: number, harmonicRms: readonly number[]): { thdFPercent: number | null; thdRPercent: number | null } {
  let squares = 0;
  for (const value of harmonicRms) squares += value * value;
  if (!(fundamentalRms > 0)) return { thdFPercent: null, thdRPercent: null };
  const distortion = Math.sqrt(squares);
  return {
    thdFPercent: (100 * distortion) / fundamentalRms,
    thdRPercent: (100 * distortion) / Math.sqrt(squares + fundamentalRms * fundamentalRms),
  };
}

/** Largest single harmonic as a percent of the fundamental, with its order. */
export function largestHarmonic(fundamentalRms: number, harmonics: readonly { order: number; rms: number }[]): { order: number; percent: number } | null {
  if (!(fundamentalRms > 0) || harmonics.length === 0) return null;
  let best = harmonics[0] as { order: number; rms: number };
  for (const harmonic of harmonics) if (harmonic.rms > best.rms) best = harmonic;
  return { order: best.order, percent: (100 * best.rms) / fundamentalRms };
}
