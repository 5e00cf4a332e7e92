import { describe, expect, it } from "vitest";
import { estimateBySpectrum, estimateByZeroCrossings, refineFrequency } from "@/lib/analysis/frequency";

describe("estimateByZeroCrossings (pins)", () => {
  it("estimateByZeroCrossings finds rising crossings at samples exactly on the level: 8, 16, 24 of a period-8 triangle (by hand)", () => {
    const period = [0, 1, 2, 1, 0, -1, -2, -1];
    const samples = Float64Array.from({ length: 33 }, (_, n) => period[n % 8]!);
    const estimate = estimateByZeroCrossings(samples, 800, 0, 2)!;
    expect(estimate.crossings).toBe(4);
    expect(estimate.firstCrossing).toBe(8);
    expect(estimate.frequencyHz).toBe(100);
  });

  it("estimateByZeroCrossings interpolates a crossing between samples: −1 then 3 crosses at a quarter step (by hand)", () => {
    const period = [-1, 3, 1, -2];
    const samples = Float64Array.from({ length: 13 }, (_, n) => period[n % 4]!);
    const estimate = estimateByZeroCrossings(samples, 400, 0, 3)!;
    expect(estimate.firstCrossing).toBe(4.25);
    expect(estimate.frequencyHz).toBe(100);
  });
});

describe("estimateBySpectrum (pins)", () => {
  // N = 1024 at 1024 S/s: bins 1 Hz apart. Under a Hann window an on-bin tone has exactly three
  // non-zero bins with neighbours at half the peak, so δ = 0; off bin the Hann three-bin
  // interpolator is exact for one complex tone (Grandke 1983), the real tone's image 200 bins away
  // adds under 1e-5 bin.
  const tone = (hz: number, count = 1024) => Float64Array.from({ length: count }, (_, n) => Math.cos((2 * Math.PI * hz * n) / 1024));

  it("estimateBySpectrum reads an on-bin tone exactly and an off-bin one to 1e-5 Hz either side of the peak", () => {
    expect(Math.abs(estimateBySpectrum(tone(100), 1024, 0)! - 100)).toBeLessThan(1e-9);
    expect(Math.abs(estimateBySpectrum(tone(99.7), 1024, 0)! - 99.7)).toBeLessThan(1e-4);
    expect(Math.abs(estimateBySpectrum(tone(100.3), 1024, 0)! - 100.3)).toBeLessThan(1e-4);
  });

  it("estimateBySpectrum needs 64 samples: 64 give an estimate, 63 none (edge)", () => {
    expect(estimateBySpectrum(tone(100, 64), 1024, 0)).not.toBeNull();
    expect(estimateBySpectrum(tone(100, 63), 1024, 0)).toBeNull();
  });
});

describe("refineFrequency (pins)", () => {
  it("refineFrequency brings a 50 Hz sine to 50 Hz within 1e-9 from estimates 0.02 Hz high and low (closed form)", () => {
    const samples = Float64Array.from({ length: 5000 }, (_, n) => Math.cos((2 * Math.PI * 50 * n) / 5000 + 0.3));
    expect(Math.abs(refineFrequency(samples, 5000, 50.02) - 50)).toBeLessThan(1e-9);
    expect(Math.abs(refineFrequency(samples, 5000, 49.98) - 50)).toBeLessThan(1e-9);
  });
});
