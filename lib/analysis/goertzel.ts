/**
 * Phasors of a real signal at arbitrary frequencies over a span that may end between samples.
 *
 * The span [start, start + L) is integrated with the trapezoid rule plus a linear piece for
 * the final fraction of a sample, so the weights sum to L exactly. This removes the first-order
 * leakage of a whole-cycle window whose length is not an integer number of samples.
 * Each frequency runs a Goertzel recursion; five are interleaved per pass over the samples, so the
 * samples stream from memory once per five frequencies and the recursions overlap in the pipeline
 * (wider blocks ran slower here: the states no longer fit the registers).
 */

const BLOCK = 5;

export interface SpanWeights {
  /** Integer part of the span. */
  whole: number;
  /** Weight of sample `start + whole` and `start + whole + 1`. */
  tailA: number;
  tailB: number;
}

export function spanWeights(spanSamples: number): SpanWeights {
  const whole = Math.floor(spanSamples);
  const r = spanSamples - whole;
  return { whole, tailA: 0.5 + r - (r * r) / 2, tailB: (r * r) / 2 };
}

/** Samples a span reads: it needs one sample beyond its end. */
export function spanFits(sampleCount: number, start: number, spanSamples: number): boolean {
  return start >= 0 && start + Math.floor(spanSamples) + 1 < sampleCount;
}

/**
 * Returns interleaved [re, im] of (2/L)·Σ w_n x_{start+n} e^{−jω_k n} for each ω_k (rad/sample):
 * the peak phasor A·e^{jφ} of a component A·cos(ωn + φ), phase referred to sample `start`.
 */
export function spanPhasors(samples: Float64Array, start: number, spanSamples: number, omegas: readonly number[]): Float64Array {
  const out = new Float64Array(2 * omegas.length);
  const { whole, tailA, tailB } = spanWeights(spanSamples);
  const first = samples[start] as number;
  const atEnd = samples[start + whole] as number;
  const pastEnd = samples[start + whole + 1] as number;
  const scale = 2 / spanSamples;
  for (let group = 0; group < omegas.length; group += BLOCK) {
    const w = Array.from({ length: BLOCK }, (_, k) => omegas[group + k] ?? 0);
    const sums = goertzelBlock(samples, start, whole, w);
    for (let k = 0; k < BLOCK && group + k < omegas.length; k++) {
      const omega = w[k] as number;
      // Σ_{n<whole} with unit weights, then the trapezoid corrections at n = 0, whole, whole + 1.
      let re = (sums[2 * k] as number) - 0.5 * first;
      let im = sums[2 * k + 1] as number;
      re += tailA * atEnd * Math.cos(omega * whole) + tailB * pastEnd * Math.cos(omega * (whole + 1));
      im -= tailA * atEnd * Math.sin(omega * whole) + tailB * pastEnd * Math.sin(omega * (whole + 1));
      out[2 * (group + k)] = re * scale;
      out[2 * (group + k) + 1] = im * scale;
    }
  }
  return out;
}

/** Σ_{n=0}^{count−1} x_{start+n} e^{−jω n} for 5 frequencies in one pass. */
function goertzelBlock(x: Float64Array, start: number, count: number, w: readonly number[]): Float64Array {
  const c0 = 2 * Math.cos(w[0] as number);
  const c1 = 2 * Math.cos(w[1] as number);
  const c2 = 2 * Math.cos(w[2] as number);
  const c3 = 2 * Math.cos(w[3] as number);
  const c4 = 2 * Math.cos(w[4] as number);
  let p0 = 0, q0 = 0, p1 = 0, q1 = 0, p2 = 0, q2 = 0, p3 = 0, q3 = 0, p4 = 0, q4 = 0;
  const end = start + count;
  for (let n = start; n < end; n++) {
    const v = x[n] as number;
    const r0 = v + c0 * p0 - q0;
    q0 = p0;
    p0 = r0;
    const r1 = v + c1 * p1 - q1;
    q1 = p1;
    p1 = r1;
    const r2 = v + c2 * p2 - q2;
    q2 = p2;
    p2 = r2;
    const r3 = v + c3 * p3 - q3;
    q3 = p3;
    p3 = r3;
    const r4 = v + c4 * p4 - q4;
    q4 = p4;
    p4 = r4;
  }
  const out = new Float64Array(10);
  const states = [[p0, q0], [p1, q1], [p2, q2], [p3, q3], [p4, q4]] as const;
  states.forEach(([s1, s2], k) => {
    const omega = w[k] as number;
    // y = s_{N−1} − e^{−jω} s_{N−2} equals Σ x_n e^{jω(N−1−n)}; rotate by e^{−jω(N−1)}.
    const yRe = s1 - Math.cos(omega) * s2;
    const yIm = Math.sin(omega) * s2;
    const turn = omega * (count - 1);
    const cosT = Math.cos(turn);
    const sinT = Math.sin(turn);
    out[2 * k] = yRe * cosT + yIm * sinT;
    out[2 * k + 1] = yIm * cosT - yRe * sinT;
  });
  return out;
}

/** Trapezoid-weighted means of x and x² over a span (same weights as `spanPhasors`). */
export function spanMoments(samples: Float64Array, start: number, spanSamples: number): { mean: number; meanSquare: number } {
  const { whole, tailA, tailB } = spanWeights(spanSamples);
  let sum = 0;
  let sumSquares = 0;
  const end = start + whole;
  for (let n = start; n < end; n++) {
    const v = samples[n] as number;
    sum += v;
    sumSquares += v * v;
  }
  const first = samples[start] as number;
  const atEnd = samples[end] as number;
  const pastEnd = samples[end + 1] as number;
  sum += -0.5 * first + tailA * atEnd + tailB * pastEnd;
  sumSquares += -0.5 * first * first + tailA * atEnd * atEnd + tailB * pastEnd * pastEnd;
  return { mean: sum / spanSamples, meanSquare: sumSquares / spanSamples };
}

/** Trapezoid-weighted mean of f(x_n, y_n) over a span: for power (x·y) and derived line voltages. */
export function spanPairMean(
  x: Float64Array,
  y: Float64Array,
  start: number,
  spanSamples: number,
  kind: "product" | "difference-squared",
): number {
  const { whole, tailA, tailB } = spanWeights(spanSamples);
  const f = kind === "product" ? (a: number, b: number) => a * b : (a: number, b: number) => (a - b) * (a - b);
  let sum = 0;
  const end = start + whole;
  if (kind === "product") {
    for (let n = start; n < end; n++) sum += (x[n] as number) * (y[n] as number);
  } else {
    for (let n = start; n < end; n++) {
      const d = (x[n] as number) - (y[n] as number);
      sum += d * d;
    }
  }
  const value = (n: number): number => f(x[n] as number, y[n] as number);
  sum += -0.5 * value(start) + tailA * value(end) + tailB * value(end + 1);
  return sum / spanSamples;
}
