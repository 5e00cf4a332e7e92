import { add, fromPolar, magnitude, multiply, scale, type Complex } from "./phasors";

/** a = 1∠120°. */
const A = fromPolar(1, (2 * Math.PI) / 3);
const A2 = fromPolar(1, (4 * Math.PI) / 3);

/**
 * Fortescue: V0 = (Va+Vb+Vc)/3, V1 = (Va+a·Vb+a²·Vc)/3, V2 = (Va+a²·Vb+a·Vc)/3.
 * Phasors follow the cos(ωt + φ) convention, so a phase lagging by 120° is B of an A-B-C set.
 */
export function symmetricalComponents(a: Complex, b: Complex, c: Complex): { zero: Complex; positive: Complex; negative: Complex } {
  return {
    zero: scale(add(add(a, b), c), 1 / 3),
    positive: scale(add(add(a, multiply(A, b)), multiply(A2, c)), 1 / 3),
    negative: scale(add(add(a, multiply(A2, b)), multiply(A, c)), 1 / 3),
  };
}

/**
 * Largest deviation from the mean over the mean, in percent: NEMA MG 1 LVUR on line-line
 * magnitudes, IEEE PVUR on line-neutral magnitudes (same arithmetic, different inputs).
 */
export function computeMaxDeviationUnbalance(magnitudes: readonly number[]): number | null {
  if (magnitudes.length === 0) return null;
  const mean = magnitudes.reduce((sum, value) => sum + value, 0) / magnitudes.length;
  if (!(mean > 0)) return null;
  return (100 * Math.max(...magnitudes.map((value) => Math.abs(value - mean)))) / mean;
}

/** VUF = 100·|V2|/|V1| (IEC 61000-4-30). */
export function computeVuf(positive: Complex, negative: Complex): number | null {
  const positiveMagnitude = magnitude(positive);
  return positiveMagnitude > 0 ? (100 * magnitude(negative)) / positiveMagnitude : null;
}

/**
 * VUF from line-line magnitudes alone: β = (a⁴+b⁴+c⁴)/(a²+b²+c²)²,
 * VUF = 100·√((1 − √(3 − 6β))/(1 + √(3 − 6β))).
 */
export function computeVufFromLineMagnitudes(a: number, b: number, c: number): number | null {
  const squares = a * a + b * b + c * c;
  if (!(squares > 0)) return null;
  const beta = (a ** 4 + b ** 4 + c ** 4) / (squares * squares);
  const root = Math.sqrt(Math.max(0, 3 - 6 * beta));
  return 100 * Math.sqrt((1 - root) / (1 + root));
}
