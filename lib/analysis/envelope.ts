import type { ParsedCapture } from "./types";

/** Min/max decimation for plots: each bucket keeps its extremes, so peaks survive. */
export function computeWaveformEnvelope(
  capture: ParsedCapture,
  buckets: number,
): { timeS: number[]; channels: { id: string; min: number[]; max: number[] }[] } {
  const count = capture.sampleCount;
  const bucketCount = Math.max(1, Math.min(Math.floor(buckets), count));
  const size = count / bucketCount;
  const timeS = Array.from({ length: bucketCount }, (_, b) => capture.timeStartS + Math.floor(b * size) / capture.sampleRateHz);
  const channels = capture.channels.map((channel) => {
    const min: number[] = new Array<number>(bucketCount);
    const max: number[] = new Array<number>(bucketCount);
    for (let b = 0; b < bucketCount; b++) {
      const from = Math.floor(b * size);
      const to = Math.max(from + 1, Math.floor((b + 1) * size));
      let low = Number.POSITIVE_INFINITY;
      let high = Number.NEGATIVE_INFINITY;
      for (let n = from; n < to && n < count; n++) {
        const v = channel.samples[n] as number;
        if (v < low) low = v;
        if (v > high) high = v;
      }
      min[b] = low;
      max[b] = high;
    }
    return { id: channel.id, min, max };
  });
  return { timeS, channels };
}
