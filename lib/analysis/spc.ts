// Statistical process control for trends of one figure across units: individuals and moving range
// (I-MR) limits, capability against the tolerance band, and the Western Electric run rules.
// Sources: DOMAIN §14 [CP/M]; d2 and D4 for subgroups of two from the usual control-chart constant
// tables (d2 = 1.128, D4 = 3.267).

/** Mean of |x_i − x_{i−1}| over σ for subgroups of two (control-chart constant d2, n = 2). */
export const D2 = 1.128;
/** Upper limit factor of the moving-range chart (D4, n = 2). */
export const D4 = 3.267;
/** Below this many points capability figures are shown as indicative only. */
export const CAPABILITY_MIN_POINTS = 20;
/** Cpk at or above this reads "capable" [CP]. */
export const CAPABLE_CPK = 1.33;

export type SpcBand = { lower: number | null; upper: number | null };

/** Western Electric rules: 1 beyond 3σ; 2 two of three beyond 2σ; 3 four of five beyond 1σ; 4 eight on one side. */
export type RunRule = 1 | 2 | 3 | 4;

export type SpcSummary = {
  n: number;
  mean: number;
  /** Sample standard deviation (n − 1), the overall spread. */
  sd: number | null;
  /** Mean moving range of consecutive points. */
  mrBar: number | null;
  /** σ within = MR̄/d2: the σ behind the control limits, Cp and Cpk. */
  sigmaWithin: number | null;
  ucl: number | null;
  lcl: number | null;
  /** Upper limit of the moving-range chart, D4·MR̄ (its lower limit is 0). */
  mrUcl: number | null;
  cp: number | null;
  cpk: number | null;
  /** Fewer than CAPABILITY_MIN_POINTS points: Cp and Cpk are indicative only. */
  indicative: boolean;
  /** For each point in order, the run rules it completes (empty when none). */
  rules: RunRule[][];
};

const sum = (values: readonly number[]) => values.reduce((a, b) => a + b, 0);

/** Moving ranges |x_i − x_{i−1}|, one fewer than the points. */
export function movingRanges(values: readonly number[]): number[] {
  const out: number[] = [];
  for (let i = 1; i < values.length; i++) out.push(Math.abs((values[i] as number) - (values[i - 1] as number)));
  return out;
}

/**
 * Cp = (USL − LSL)/(6σ) needs both limits; Cpk = min(USL − x̄, x̄ − LSL)/(3σ) takes the sides the band
 * has (a one-sided band: that side only). Null without σ or without a limit.
 */
export function capability(mean: number, sigma: number | null, band: SpcBand): { cp: number | null; cpk: number | null } {
  if (sigma === null || !(sigma > 0)) return { cp: null, cpk: null };
  const { lower, upper } = band;
  const cp = lower !== null && upper !== null ? (upper - lower) / (6 * sigma) : null;
  const sides = [upper !== null ? (upper - mean) / (3 * sigma) : null, lower !== null ? (mean - lower) / (3 * sigma) : null].filter((v): v is number => v !== null);
  return { cp, cpk: sides.length > 0 ? Math.min(...sides) : null };
}

/**
 * The run rules each point completes, with centre and σ: a rule is marked on the last point of the
 * window that breaks it, and only when that point is itself beyond the line on the same side.
 */
export function runRules(values: readonly number[], centre: number, sigma: number): RunRule[][] {
  const z = values.map((v) => (v - centre) / sigma);
  return z.map((zi, i) => {
    const broken: RunRule[] = [];
    if (Math.abs(zi) > 3) broken.push(1);
    const side = Math.sign(zi);
    const beyond = (from: number, k: number) => z.slice(from, i + 1).filter((v) => side * v > k).length;
    if (side !== 0 && i >= 2 && side * zi > 2 && beyond(i - 2, 2) >= 2) broken.push(2);
    if (side !== 0 && i >= 4 && side * zi > 1 && beyond(i - 4, 1) >= 4) broken.push(3);
    if (side !== 0 && i >= 7 && beyond(i - 7, 0) === 8) broken.push(4);
    return broken;
  });
}

/** n, mean, spread, I-MR limits, capability against the band and run-rule marks for points in order. */
export function summariseSeries(values: readonly number[], band: SpcBand): SpcSummary | null {
  const n = values.length;
  if (n === 0) return null;
  const mean = sum(values) / n;
  const sd = n > 1 ? Math.sqrt(sum(values.map((v) => (v - mean) ** 2)) / (n - 1)) : null;
  const ranges = movingRanges(values);
  const mrBar = ranges.length > 0 ? sum(ranges) / ranges.length : null;
  const sigmaWithin = mrBar !== null ? mrBar / D2 : null;
  const limits = sigmaWithin !== null ? { ucl: mean + 3 * sigmaWithin, lcl: mean - 3 * sigmaWithin, mrUcl: D4 * (mrBar as number) } : { ucl: null, lcl: null, mrUcl: null };
  const rules = sigmaWithin !== null && sigmaWithin > 0 ? runRules(values, mean, sigmaWithin) : values.map(() => []);
  return { n, mean, sd, mrBar, sigmaWithin, ...limits, ...capability(mean, sigmaWithin, band), indicative: n < CAPABILITY_MIN_POINTS, rules };
}
