// Synthetic bench captures for the demo scenario only (invented units, invented defects).
// Seeded, so every fresh demo shows the same figures.

export type DemoWave = {
  lineVoltsRms: number;          // line-to-line RMS of a balanced machine (single-phase: the terminal RMS)
  frequencyHz: number;
  phases: 1 | 3;
  harmonicsPercent?: Record<number, number>; // order -> % of fundamental, same in every phase
  phaseScale?: [number, number, number];     // per-phase amplitude factors (unbalance)
  phaseErrorDeg?: [number, number, number];  // per-phase angle errors (winding displacement)
  noisePercent?: number;
  cycles?: number;
  sampleRateHz?: number;
  /** Flat tops: every recorded value held within ± this percent of the line peak (a saturated input). */
  clipAtPercent?: number;
  /** Multiplies what is written (0.01: a 100:1 probe recorded as if it were 1:1). */
  recordedScale?: number;
  seed: number;
};

function mulberry32(seed: number) {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** CSV text as a bench oscilloscope might export it: a short preamble, a time column, line-to-line channels. */
export function renderDemoCsv(w: DemoWave): string {
  const fs = w.sampleRateHz ?? 25_000;
  const n = Math.round(((w.cycles ?? 12) / w.frequencyHz) * fs);
  const rand = mulberry32(w.seed);
  const gauss = () => Math.sqrt(-2 * Math.log(rand() + 1e-12)) * Math.cos(2 * Math.PI * rand());
  const omega = 2 * Math.PI * w.frequencyHz;
  const harmonics = Object.entries(w.harmonicsPercent ?? {}).map(([h, p]) => [Number(h), p / 100] as const);
  const phasePeak = w.phases === 3 ? (w.lineVoltsRms / Math.sqrt(3)) * Math.SQRT2 : w.lineVoltsRms * Math.SQRT2;
  const scale = w.phaseScale ?? [1, 1, 1];
  const err = (w.phaseErrorDeg ?? [0, 0, 0]).map((d) => (d * Math.PI) / 180);
  const noise = ((w.noisePercent ?? 0.05) / 100) * phasePeak;
  const phase = (k: number, t: number) => {
    const shift = (-2 * Math.PI * k) / 3 + (err[k] ?? 0);
    let v = Math.sin(omega * t + shift);
    for (const [h, a] of harmonics) v += a * Math.sin(h * (omega * t + shift));
    return (scale[k] ?? 1) * phasePeak * v;
  };
  const linePeak = w.lineVoltsRms * Math.SQRT2;
  const clip = w.clipAtPercent !== undefined ? (w.clipAtPercent / 100) * linePeak : Number.POSITIVE_INFINITY;
  const k = w.recordedScale ?? 1;
  const out = (v: number) => (k * Math.max(-clip, Math.min(clip, v))).toFixed(k < 0.1 ? 5 : 3);
  const lines = [
    "Instrument,Demo bench recorder",
    `Sample Interval,${(1 / fs).toExponential(6)}`,
    `Record Length,${n}`,
  ];
  if (w.phases === 3) {
    lines.push("Time (s),V_AB (V),V_BC (V),V_CA (V)");
    for (let i = 0; i < n; i++) {
      const t = i / fs;
      const [a, b, c] = [phase(0, t), phase(1, t), phase(2, t)];
      lines.push(`${t.toExponential(6)},${out(a - b + noise * gauss())},${out(b - c + noise * gauss())},${out(c - a + noise * gauss())}`);
    }
  } else {
    lines.push("Time (s),V_OUT (V)");
    for (let i = 0; i < n; i++) {
      const t = i / fs;
      lines.push(`${t.toExponential(6)},${out(phase(0, t) + noise * gauss())}`);
    }
  }
  return `${lines.join("\n")}\n`;
}
