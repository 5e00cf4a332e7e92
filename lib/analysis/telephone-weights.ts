/**
 * Weighting tables for telephone interference indices, kept as data.
 *
 * PSOPHOMETRIC_DB: the psophometric weighting of ITU-T Recommendation O.41 (the CCIF-1951
 * curve), relative to 800 Hz, in dB, at the frequencies of the table reproduced from O.41 (1994)
 * in TIA-470.120-C (draft 22a), Annex A, Table A.1 [S secondary]. An earlier version of this
 * table, written from memory, had C-message-like values between 200 and 700 Hz (up to 5 dB off,
 * where the 3rd to 13th harmonics of 50 Hz fall). The table stops at 5 kHz, where THF stops. IEC 60034-1 derives its THF weights as
 * λ(f) = p(f)·f/800 with p the psophometric weight as a ratio [M ⚠].
 *
 * TIF_WEIGHTS: the 1960 single-frequency TIF weights (C-message weighting × 5·f; 5000 at
 * 1 kHz), as tabulated in IEEE Std 519-1992 Table 10.2 and IEEE Std 115, from memory [M ⚠].
 * Between table points both are interpolated linearly; outside the tables the weight is 0.
 */
export interface WeightPoint {
  frequencyHz: number;
  weight: number;
}

export const PSOPHOMETRIC_SOURCE = "ITU-T O.41 psophometric weighting (table as reproduced in TIA-470.120-C Annex A); THF weights λ = p·f/800 per IEC 60034-1 [M ⚠]";
export const TIF_SOURCE = "1960 single-frequency TIF weights (IEEE Std 519-1992 Table 10.2), values from memory [M ⚠]";

export const PSOPHOMETRIC_DB: readonly [number, number][] = [
  [16.66, -85.0], [50, -63.0], [100, -41.0], [200, -21.0], [300, -10.6],
  [400, -6.3], [500, -3.6], [600, -2.0], [700, -0.9], [800, 0.0], [900, 0.6],
  [1000, 1.0], [1200, 0.0], [1400, -0.9], [1600, -1.7], [1800, -2.4], [2000, -3.0],
  [2500, -4.2], [3000, -5.6], [3500, -8.5], [4000, -15.0], [4500, -25.0], [5000, -36.0],
];

export const TIF_WEIGHTS: readonly [number, number][] = [
  [60, 0.5], [180, 30], [300, 225], [360, 400], [420, 650], [540, 1320], [660, 2260],
  [720, 2760], [780, 3360], [900, 4350], [1000, 5000], [1020, 5100], [1080, 5400],
  [1140, 5630], [1260, 6050], [1380, 6370], [1440, 6650], [1500, 6680], [1620, 6970],
  [1740, 7320], [1800, 7570], [1860, 7820], [1980, 8330], [2100, 8830], [2160, 9080],
  [2220, 9330], [2340, 9840], [2460, 10340], [2580, 10600], [2820, 10210], [2940, 9820],
  [3000, 9670], [3180, 8740], [3300, 8090], [3540, 6730], [3660, 6130], [3900, 4400],
  [4020, 3700], [4260, 2750], [4380, 2190], [4500, 1840], [4620, 1600], [4740, 1320],
  [4860, 1070], [4980, 860], [5100, 732], [5400, 410], [6000, 190],
];

/** Linear interpolation in a [frequency, value] table; `outside` beyond its ends. */
export function interpolateTable(table: readonly [number, number][], frequencyHz: number, outside: number): number {
  const first = table[0];
  const last = table[table.length - 1];
  if (!first || !last || frequencyHz < first[0] || frequencyHz > last[0]) return outside;
  for (let i = 1; i < table.length; i++) {
    const [f1, v1] = table[i] as [number, number];
    const [f0, v0] = table[i - 1] as [number, number];
    if (frequencyHz <= f1) return v0 + ((v1 - v0) * (frequencyHz - f0)) / (f1 - f0);
  }
  return outside;
}

/** THF weight λ(f) = 10^(p_dB/20)·f/800. */
export function thfWeight(frequencyHz: number): number {
  const decibels = interpolateTable(PSOPHOMETRIC_DB, frequencyHz, Number.NEGATIVE_INFINITY);
  return decibels === Number.NEGATIVE_INFINITY ? 0 : 10 ** (decibels / 20) * (frequencyHz / 800);
}

export function tifWeight(frequencyHz: number): number {
  return interpolateTable(TIF_WEIGHTS, frequencyHz, 0);
}
