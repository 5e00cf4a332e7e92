import { describe, expect, it } from "vitest";
import { computeHarmonics, highestOrderBelowNyquist } from "@/lib/analysis/harmonics";
import { spanMoments, spanPairMean, spanPhasors } from "@/lib/analysis/goertzel";
import { computeThd, largestHarmonic } from "@/lib/analysis/thd";
import { PINS, rel } from "./steps";

const fs = 1000;
const f = 50;
// cos(ωt) + 3·cos(2ωt + 0.7) at 20 samples a cycle, 5 whole cycles.
const samples = Float64Array.from({ length: 100 }, (_, n) => Math.cos((2 * Math.PI * n) / 20) + 3 * Math.cos((4 * Math.PI * n) / 20 + 0.7));
const window = { start: 0, spanSamples: 100, cycles: 5 };

describe("computeHarmonics (pins)", () => {
  it("computeHarmonics gives the second harmonic's RMS 3/√2 and phase 0.7 rad = 40.107°, first 1/√2 (closed form)", () => {
    const [first, second] = computeHarmonics(samples, fs, f, window, 5);
    expect(rel(first!.rms, 1 / Math.SQRT2)).toBeLessThan(1e-12);
    expect(rel(second!.rms, 3 / Math.SQRT2)).toBeLessThan(1e-12);
    expect(Math.abs(second!.phaseDeg - 40.10704565915762)).toBeLessThan(1e-9); // 0.7·180/π by hand
    expect(Math.abs(first!.phaseDeg)).toBeLessThan(1e-9);
  });

  it("computeHarmonics returns every order up to maxOrder and stops below Nyquist (500 Hz = order 10 excluded)", () => {
    expect(computeHarmonics(samples, fs, f, window, 5).map((h) => h.order)).toEqual([1, 2, 3, 4, 5]);
    expect(computeHarmonics(samples, fs, f, window, 10).map((h) => h.order)).toEqual([1, 2, 3, 4, 5, 6, 7, 8, 9]);
  });

  it("highestOrderBelowNyquist is 9 at fs/2f = 10 exactly, 8 at 8.33 (edge: an order at Nyquist is not below it)", () => {
    expect(highestOrderBelowNyquist(1000, 50)).toBe(9);
    expect(highestOrderBelowNyquist(1000, 60)).toBe(8);
    expect(highestOrderBelowNyquist(1001, 50)).toBe(10);
  });
});

describe("goertzel spans (pins)", () => {
  it("spanMoments and spanPhasors of a constant 1 over a fractional span give mean 1 and DC phasor 2 (weights sum to L)", () => {
    const ones = new Float64Array(200).fill(1);
    for (const span of [116.66666666666667, 50.25, 99.5]) {
      expect(Math.abs(spanMoments(ones, 3, span).mean - 1)).toBeLessThan(1e-13);
      const [re, im] = spanPhasors(ones, 3, span, [0]);
      expect(Math.abs(re! - 2)).toBeLessThan(1e-13);
      expect(Math.abs(im!)).toBeLessThan(1e-13);
    }
  });

  it("spanPairMean of cos·cos and of (cos − (−cos))² over whole cycles gives ½ and 2 (closed form)", () => {
    const x = Float64Array.from({ length: 120 }, (_, n) => Math.cos((2 * Math.PI * n) / 20));
    const y = x.map((v) => -v);
    expect(rel(spanPairMean(x, x, 0, 100, "product"), 0.5)).toBeLessThan(1e-12);
    expect(rel(spanPairMean(x, y, 0, 100, "difference-squared"), 2)).toBeLessThan(1e-12);
  });
});

describe("computeThd and largestHarmonic (pins)", () => {
  it("computeThd(100, [4, 3]) gives THD-F 5 % and THD-R 100·5/√10025 % (numpy script)", () => {
    const thd = computeThd(100, [4, 3]);
    expect(rel(thd.thdFPercent!, 5)).toBeLessThan(1e-12);
    expect(rel(thd.thdRPercent!, PINS.thdR_100_4_3!)).toBeLessThan(1e-12);
  });

  it("computeThd of a zero fundamental is not computable (null), whatever the harmonics", () => {
    expect(computeThd(0, [1])).toEqual({ thdFPercent: null, thdRPercent: null });
  });

  it("largestHarmonic keeps the lower order on a tie and gives 100·rms/fundamental", () => {
    expect(largestHarmonic(50, [{ order: 3, rms: 2 }, { order: 5, rms: 2 }, { order: 7, rms: 1 }])).toEqual({ order: 3, percent: 4 });
  });
});
