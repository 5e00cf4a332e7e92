import type { ParsedCapture } from "@/lib/analysis";

/** A component A·cos(h·ω·t + φ) of a synthetic waveform; `order` 0 is DC. */
export interface Tone {
  order: number;
  amplitude: number;
  phaseRad?: number;
}

export function synthesise(tones: readonly Tone[], frequencyHz: number, sampleRateHz: number, count: number, phaseShiftRad = 0): Float64Array {
  const out = new Float64Array(count);
  for (let n = 0; n < count; n++) {
    const theta = (2 * Math.PI * frequencyHz * n) / sampleRateHz;
    let v = 0;
    for (const tone of tones) v += tone.order === 0 ? tone.amplitude : tone.amplitude * Math.cos(tone.order * (theta + phaseShiftRad) + (tone.phaseRad ?? 0));
    out[n] = v;
  }
  return out;
}

export function captureOf(channels: { id: string; unit?: "V" | "A"; samples: Float64Array }[], sampleRateHz: number): ParsedCapture {
  return {
    sampleRateHz,
    sampleCount: channels[0]?.samples.length ?? 0,
    timeStartS: 0,
    channels: channels.map((channel) => ({ id: channel.id, unit: channel.unit ?? "V", samples: channel.samples })),
    metadata: {},
    warnings: [],
  };
}

/** Deterministic uniform noise in [−½, ½) (32-bit LCG), for tests that need a little dirt. */
export function seededNoise(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (Math.imul(state, 1664525) + 1013904223) >>> 0;
    return state / 2 ** 32 - 0.5;
  };
}

export const relativeError = (measured: number, expected: number): number => Math.abs(measured - expected) / Math.abs(expected);

/** Smallest angle between two angles in degrees. */
export function angleGapDeg(a: number, b: number): number {
  const d = (((a - b) % 360) + 540) % 360 - 180;
  return Math.abs(d);
}
