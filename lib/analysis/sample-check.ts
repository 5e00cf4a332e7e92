import { CaptureRejection } from "./rejection";
import type { CaptureChannel } from "./types";

/**
 * Smallest peak-to-peak swing a channel must show, in its SI unit (1 nV or 1 nA). Bench signals
 * are millivolts and more even through a 1000:1 probe; a swing below this is a dead channel, a
 * unit mistake or denormal noise (a file around 1e-320 has no signal to measure) [CP].
 */
export const MIN_PEAK_TO_PEAK = 1e-9;

/**
 * Headroom kept below overflow: the sum of squares over the whole capture, and products of two
 * channels (power), must stay finite with this factor to spare [CP].
 */
const OVERFLOW_HEADROOM = 16;

/** Largest |sample| whose square, summed over `count` samples with headroom, stays finite. */
export function largestSafeMagnitude(count: number): number {
  return Math.sqrt(Number.MAX_VALUE / (OVERFLOW_HEADROOM * Math.max(1, count)));
}

const row = (index: number) => `sample row ${index + 1}`;

/**
 * Refuses a channel whose values cannot give finite, meaningful figures: a value that is not
 * finite, values so large their squares overflow (RMS would be infinite), or a swing below
 * MIN_PEAK_TO_PEAK. The message names the column and the sample row (1-based, data rows only).
 */
export function checkChannelValues(channel: CaptureChannel): void {
  const x = channel.samples;
  const limit = largestSafeMagnitude(x.length);
  let min = Number.POSITIVE_INFINITY;
  let max = Number.NEGATIVE_INFINITY;
  let largestIndex = -1;
  let largest = 0;
  for (let n = 0; n < x.length; n++) {
    const v = x[n] as number;
    if (v !== v || v === Number.POSITIVE_INFINITY || v === Number.NEGATIVE_INFINITY) {
      throw new CaptureRejection("value-not-finite", `A sample is not a finite number (${v}) at ${row(n)}: check the probe ratio and the export`, { column: channel.id });
    }
    if (v < min) min = v;
    if (v > max) max = v;
    const magnitude = v < 0 ? -v : v;
    if (magnitude > largest) {
      largest = magnitude;
      largestIndex = n;
    }
  }
  if (largest > limit) {
    throw new CaptureRejection(
      "value-overflow",
      `A sample of ${largest.toPrecision(3)} ${channel.unit} at ${row(largestIndex)} is too large to square (RMS would overflow above ${limit.toPrecision(3)}): check the units and the probe ratio`,
      { column: channel.id },
    );
  }
  // An exactly constant current channel is an idle one (no current flows at no load): analysed,
  // with "no fundamental" warnings. A voltage that does not swing, or a current that swings by
  // less than a nanoampere, has nothing to measure.
  const idleCurrent = channel.unit === "A" && max === min;
  if (x.length > 0 && !idleCurrent && !(max - min >= MIN_PEAK_TO_PEAK)) {
    throw new CaptureRejection(
      "value-too-small",
      `The channel swings only ${(max - min).toPrecision(3)} ${channel.unit} peak to peak, below the ${MIN_PEAK_TO_PEAK} ${channel.unit} a measurement needs: a dead channel, or the wrong unit or probe ratio`,
      { column: channel.id },
    );
  }
}
