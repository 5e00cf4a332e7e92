import { closeSync, existsSync, openSync, renameSync, statSync, writeSync } from "node:fs";

/** What every benchmark capture holds: invented line-line voltages of a 4-pole set at 1500 rpm. */
export const BENCH_SIGNAL = {
  sampleRateHz: 50_000,
  frequencyHz: 50,
  lineRmsVolts: 400,
  /** Harmonic order → amplitude relative to the fundamental. */
  harmonics: { 3: 0.012, 5: 0.021, 7: 0.013, 11: 0.006, 13: 0.004 } as Record<number, number>,
  noiseRelative: 0.0005,
  header: "Time (s),V_AB (V),V_BC (V),V_CA (V)",
} as const;

/** Deterministic uniform noise (32-bit LCG): the benchmark files are the same on every machine. */
function makeNoise(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
    return state / 2 ** 32 - 0.5;
  };
}

/** Writes `rows` rows to `path` unless a file of that name already exists; returns its size. */
export function ensureBenchCapture(path: string, rows: number): number {
  if (existsSync(path)) return statSync(path).size;
  const { sampleRateHz, frequencyHz, lineRmsVolts, harmonics, noiseRelative, header } = BENCH_SIGNAL;
  const peak = lineRmsVolts * Math.SQRT2;
  const noise = makeNoise(rows);
  const orders = Object.entries(harmonics).map(([order, amplitude]) => [Number(order), amplitude * peak] as const);
  const temporary = `${path}.partial`;
  const fd = openSync(temporary, "w");
  const lines: string[] = [header];
  let pending = header.length;
  const flush = (): void => {
    writeSync(fd, `${lines.join("\n")}\n`);
    lines.length = 0;
    pending = 0;
  };
  for (let n = 0; n < rows; n++) {
    const t = n / sampleRateHz;
    const theta = 2 * Math.PI * frequencyHz * t;
    const phase = (shift: number): string => {
      let v = peak * Math.cos(theta + shift);
      for (const [order, amplitude] of orders) v += amplitude * Math.cos(order * (theta + shift));
      return (v + noiseRelative * peak * noise()).toFixed(3);
    };
    const line = `${t.toFixed(7)},${phase(0)},${phase((-2 * Math.PI) / 3)},${phase((2 * Math.PI) / 3)}`;
    lines.push(line);
    pending += line.length;
    if (pending > 1 << 20) flush();
  }
  flush();
  closeSync(fd);
  renameSync(temporary, path);
  return statSync(path).size;
}
