import { CLIPPING_INVALIDATES } from "./invalidation";
import type { QualityWarning } from "./types";

/**
 * Flat tops at the extreme values: runs of identical samples at the maximum or minimum at least
 * 2 % of a cycle long (7.2°), seen at least twice. Quantised sines do not reach that; a clipped
 * probe or a saturated input does.
 */
export function flatTopRunSamples(samplesPerCycle: number): number {
  return Math.max(4, Math.ceil(0.02 * samplesPerCycle));
}

export function clippingWarning(channelId: string, runs: number, longestRun: number): QualityWarning | null {
  if (runs < 2) return null;
  return {
    code: "clipping",
    message: `Channel "${channelId}" has ${runs} flat tops at its extreme value (up to ${longestRun} samples): the input may be clipped; its peak, crest factor and distortion figures are unreliable and not judged`,
    channel: channelId,
    invalidates: [...CLIPPING_INVALIDATES],
  };
}

/** DC above 2 % of the fundamental's peak is worth a look (probe offset, integrator drift) [CP]. */
export function dcOffsetWarning(channelId: string, dc: number, fundamentalPeak: number): QualityWarning | null {
  if (!(fundamentalPeak > 0) || Math.abs(dc) <= 0.02 * fundamentalPeak) return null;
  return {
    code: "dc-offset",
    message: `Channel "${channelId}" carries a DC offset of ${dc.toPrecision(4)} (${((100 * Math.abs(dc)) / fundamentalPeak).toFixed(1)} % of the fundamental peak)`,
  };
}

/** Expected poles 120·f/n must be an even integer; 2 % slack for speed reading and slip [CP]. */
export function polePairWarning(polesFromFrequency: number): QualityWarning | null {
  const nearestEven = Math.max(2, 2 * Math.round(polesFromFrequency / 2));
  if (Math.abs(polesFromFrequency - nearestEven) <= 0.02 * nearestEven) return null;
  return {
    code: "poles-not-even",
    message: `Speed and frequency imply ${polesFromFrequency.toFixed(3)} poles, not an even integer: check the speed entered and the rating`,
  };
}
