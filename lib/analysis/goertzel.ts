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

/** Spans within this of an integer number of samples are taken as integer. */
const INTEGER_SLACK = 1e-6;

export interface SpanWeights {
  /** Samples summed with unit weight: offsets 0..whole−1 from the start. */
  whole: number;
  /** Weight corrections on top of the unit weights, by offset from the start. */
  edges: { offset: number; weight: number }[];
}

/**
 * Trapezoid over [0, whole] plus the linear piece over the final fraction r: corrections −½ at
 * offset 0, ½ + r − r²/2 at `whole`, r²/2 at `whole + 1`. A span of exactly `whole` samples that
 * ends with the record uses plain unit weights: over whole periods that is the periodic trapezoid.
 */
export function spanWeights(sampleCount: number, start: number, spanSamples: number): SpanWeights {
  let whole = Math.floor(spanSamples);
  let r = spanSamples - whole;
  if (r > 1 - INTEGER_SLACK) {
    whole += 1;
    r = 0;
  } else if (r < INTEGER_SLACK) {
    r = 0;
  }
  if (r === 0 && start + whole === sampleCount) return { whole, edges: [] };
  const edges = [
    { offset: 0, weight: -0.5 },
    { offset: whole, weight: 0.5 + r - (r * r) / 2 },
  ];
  if (r > 0) edges.push({ offset: whole + 1, weight: (r * r) / 2 });
  return { whole, edges };
}

/** True when every sample a span reads lies inside the record. */
export function spanFits(sampleCount: number, start: number, spanSamples: number): boolean {
  if (start < 0 || !(spanSamples >= 1)) return false;
  const { whole, edges } = spanWeights(sampleCount, start, spanSamples);
  const last = edges.reduce((furthest, edge) => Math.max(furthest, edge.offset), whole - 1);
  return start + last < sampleCount;
}

/**
 * Returns interleaved [re, im] of (2/L)·Σ w_n x_{start+n} e^{−jω_k n} for each ω_k (rad/sample):
 * the peak phasor A·e^{jφ} of a component A·cos(ωn + φ), phase referred to sample `start`.
 */
export function spanPhasors(samples: Float64Array, start: number, spanSamples: number, omegas: readonly number[]): Float64Array {
  const out = new Float64Array(2 * omegas.length);
  const { whole, edges } = spanWeights(samples.length, start, spanSamples);
  const scale = 2 / spanSamples;
  for (let group = 0; group < omegas.length; group += BLOCK) {
    const w = Array.from({ length: BLOCK }, (_, k) => omegas[group + k] ?? 0);
    const sums = omegas.length - group === 1 ? goertzelSingle(samples, start, whole, w[0] as number) : goertzelBlock(samples, start, whole, w);
    for (let k = 0; k < BLOCK && group + k < omegas.length; k++) {
      const omega = w[k] as number;
      let re = sums[2 * k] as number;
      let im = sums[2 * k + 1] as number;
      for (const { offset, weight } of edges) {
        const value = weight * (samples[start + offset] as number);
        re += value * Math.cos(omega * offset);
        im -= value * Math.sin(omega * offset);
      }
      out[2 * (group + k)] = re * scale;
      out[2 * (group + k) + 1] = im * scale;
    }
  }
  return out;
}

/** One frequency alone (the frequency refinement): the same recursion without idle lanes. */
function goertzelSingle(x: Float64Array, start: number, count: number, omega: number): Float64Array {
  const c = 2 * Math.cos(omega);
  let p = 0;
  let q = 0;
  const end = start + count;
  for (let n = start; n < end; n++) {
    const r = (x[n] as number) + c * p - q;
    q = p;
    p = r;
  }
  return rotateGoertzel([[p, q]], [omega], count);
}

/** y = s_{N−1} − e^{−jω}·s_{N−2} equals Σ x_n e^{jω(N−1−n)}; rotating by e^{−jω(N−1)} gives Σ x_n e^{−jωn}. */
function rotateGoertzel(states: readonly (readonly [number, number])[], omegas: readonly number[], count: number): Float64Array {
  const out = new Float64Array(2 * states.length);
  states.forEach(([s1, s2], k) => {
    const omega = omegas[k] as number;
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
  return rotateGoertzel([[p0, q0], [p1, q1], [p2, q2], [p3, q3], [p4, q4]], w, count);
}

/** Trapezoid-weighted means of x and x² over a span (same weights as `spanPhasors`). */
export function spanMoments(samples: Float64Array, start: number, spanSamples: number): { mean: number; meanSquare: number } {
  const { whole, edges } = spanWeights(samples.length, start, spanSamples);
  let sum = 0;
  let sumSquares = 0;
  const end = start + whole;
  for (let n = start; n < end; n++) {
    const v = samples[n] as number;
    sum += v;
    sumSquares += v * v;
  }
  for (const { offset, weight } of edges) {
    const v = samples[start + offset] as number;
    sum += weight * v;
    sumSquares += weight * v * v;
  }
  return { mean: sum / spanSamples, meanSquare: sumSquares / spanSamples };
}

/** Trapezoid-weighted mean of x·y or (x − y)² over a span: for power and derived line voltages. */
export function spanPairMean(x: Float64Array, y: Float64Array, start: number, spanSamples: number, kind: "product" | "difference-squared"): number {
  const { whole, edges } = spanWeights(x.length, start, spanSamples);
  const end = start + whole;
  let sum = 0;
  if (kind === "product") {
    for (let n = start; n < end; n++) sum += (x[n] as number) * (y[n] as number);
  } else {
    for (let n = start; n < end; n++) {
      const d = (x[n] as number) - (y[n] as number);
      sum += d * d;
    }
  }
  for (const { offset, weight } of edges) {
    const a = x[start + offset] as number;
    const b = y[start + offset] as number;
    sum += weight * (kind === "product" ? a * b : (a - b) * (a - b));
  }
  return sum / spanSamples;
}
