import { symmetricalComponents } from "@/lib/analysis";
import { angleRad, fromPolar, magnitude, toDeg, wrapDeg, type Complex } from "@/lib/analysis/phasors";

// The figures of a phasor diagram, from a stored analysis report: pure, so it is unit-tested apart
// from the drawing. Angles are referred to phase A and positive counter-clockwise (cosine
// convention, as the report's phaseDeg): a positive A-B-C set reads A 0°, B −120°, C +120°.

type ChannelLike = { id: string; role: string; fundamental: { rms: number; phaseDeg: number } };
type ThreePhaseLike = { basis: "line-neutral" | "line-line"; sequence: "positive" | "negative"; sequenceComponents: { positive: number; negative: number; zero: number } };
export type PhasorReport = { channels: readonly ChannelLike[]; threePhase: ThreePhaseLike | null };

export type Phasor = { id: string; name: string; rms: number; angleDeg: number };

export type PhasorSet = {
  basis: ThreePhaseLike["basis"];
  sequence: ThreePhaseLike["sequence"];
  phases: [Phasor, Phasor, Phasor];
  /** Fortescue components of the drawn set, RMS, angles referred to phase A. */
  positive: Phasor;
  negative: Phasor;
  zero: Phasor;
  /** |V2| / |V1| in percent, null when V1 is zero. */
  negativePercent: number | null;
};

const ROLES = { "line-neutral": [["van", "A–N"], ["vbn", "B–N"], ["vcn", "C–N"]], "line-line": [["vab", "A–B"], ["vbc", "B–C"], ["vca", "C–A"]] } as const;

const polar = (id: string, name: string, value: Complex): Phasor => ({ id, name, rms: magnitude(value), angleDeg: magnitude(value) > 0 ? wrapDeg(toDeg(angleRad(value))) : 0 });

/** The three fundamental voltage phasors of the report's three-phase basis, or null without a full set. */
export function phasorSet(report: PhasorReport): PhasorSet | null {
  const tp = report.threePhase;
  if (!tp) return null;
  const found = ROLES[tp.basis].map(([role, name]) => {
    const channel = report.channels.find((c) => c.role === role);
    return channel ? { channel, name } : null;
  });
  if (found.some((f) => f === null)) return null;
  const [a, b, c] = found as [{ channel: ChannelLike; name: string }, { channel: ChannelLike; name: string }, { channel: ChannelLike; name: string }];
  const reference = a.channel.fundamental.phaseDeg;
  const rotated = [a, b, c].map(({ channel }) => fromPolar(channel.fundamental.rms, ((channel.fundamental.phaseDeg - reference) * Math.PI) / 180)) as [Complex, Complex, Complex];
  const parts = symmetricalComponents(...rotated);
  const v1 = magnitude(parts.positive);
  return {
    basis: tp.basis,
    sequence: tp.sequence,
    phases: [a, b, c].map(({ channel, name }, i) => polar(channel.id, name, rotated[i] as Complex)) as [Phasor, Phasor, Phasor],
    positive: polar("v1", "V₁", parts.positive),
    negative: polar("v2", "V₂", parts.negative),
    zero: polar("v0", "V₀", parts.zero),
    negativePercent: v1 > 0 ? (100 * magnitude(parts.negative)) / v1 : null,
  };
}

/**
 * SVG coordinates of a phasor's tip on a diagram of `radius` around (0, 0) where `fullScale` RMS
 * reaches the radius. SVG's y grows downward, so counter-clockwise is −y.
 */
export function tipOf(phasor: { rms: number; angleDeg: number }, fullScale: number, radius: number): { x: number; y: number } {
  const length = fullScale > 0 ? (radius * phasor.rms) / fullScale : 0;
  const rad = (phasor.angleDeg * Math.PI) / 180;
  const x = length * Math.cos(rad);
  const y = -length * Math.sin(rad);
  // No "-0" in an attribute.
  return { x: x === 0 ? 0 : x, y: y === 0 ? 0 : y };
}

const FACTORS = [1, 2, 5, 10, 20, 50, 100];

/**
 * The magnification (1, 2, 5 … 100) that draws a small negative-sequence phasor at most
 * `targetFraction` of full scale, so it can be seen beside the phases; 1 when it is already large.
 */
export function magnificationFor(rms: number, fullScale: number, targetFraction = 0.4): number {
  if (!(rms > 0) || !(fullScale > 0)) return 1;
  return FACTORS.filter((factor) => rms * factor <= targetFraction * fullScale).at(-1) ?? 1;
}

/** A phasor shorter than this fraction of the radius is not drawn (an arrow of a few pixels misleads). */
export const SMALLEST_DRAWN_FRACTION = 0.03;
