import type { Verdict } from "@/lib/analysis";
import { formatFigureWithUnit, quantityFor } from "./format-figure";

// How far a judged figure sits from the limit it is nearest: what an operator needs to read first
// for a check that is outside or near its edge. Pure and browser-safe.

export type Margin = {
  /** The limit the figure is measured against. */
  side: "lower" | "upper";
  limit: number;
  /** measured − limit: positive above the limit, negative below it. */
  distance: number;
  inside: boolean;
  /** "0.20 % below the upper limit 5.00 %", "3.2 V above the upper limit 418.0 V". */
  words: string;
};

/**
 * The nearer limit of a numeric verdict and the distance to it, in the verdict's unit; null for a
 * figure that is missing or a word (phase sequence), or a check without limits.
 */
export function marginOf(verdict: Pick<Verdict, "check" | "measured" | "unit" | "lower" | "upper">): Margin | null {
  const { measured, lower, upper, unit } = verdict;
  if (typeof measured !== "number" || !Number.isFinite(measured)) return null;
  const candidates: { side: "lower" | "upper"; limit: number }[] = [];
  if (lower !== null && Number.isFinite(lower)) candidates.push({ side: "lower", limit: lower });
  if (upper !== null && Number.isFinite(upper)) candidates.push({ side: "upper", limit: upper });
  if (candidates.length === 0) return null;
  // Outside a limit, that limit; inside both, the closer one.
  const outside = candidates.find((c) => (c.side === "lower" ? measured < c.limit : measured > c.limit));
  const nearest = outside ?? candidates.reduce((best, c) => (Math.abs(measured - c.limit) < Math.abs(measured - best.limit) ? c : best));
  const distance = measured - nearest.limit;
  const options = { quantity: quantityFor(unit, verdict.check) };
  const amount = formatFigureWithUnit(Math.abs(distance), unit, options);
  const limitText = formatFigureWithUnit(nearest.limit, unit, options);
  const where = distance === 0 ? "at" : distance > 0 ? `${amount} above` : `${amount} below`;
  return { side: nearest.side, limit: nearest.limit, distance, inside: !outside, words: `${where} the ${nearest.side} limit ${limitText}` };
}
