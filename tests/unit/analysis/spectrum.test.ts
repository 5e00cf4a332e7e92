import { describe, expect, it } from "vitest";
import { realSpectrum } from "@/lib/analysis/spectrum";
import { spanPhasors } from "@/lib/analysis/goertzel";
import { seededNoise } from "./signals";

/** The textbook DFT, X_k = Σ x_n e^{−j2πkn/N}, as the independent reference. */
function naiveDft(x: Float64Array, k: number): [number, number] {
  let re = 0;
  let im = 0;
  for (let n = 0; n < x.length; n++) {
    const angle = (-2 * Math.PI * k * n) / x.length;
    re += (x[n] as number) * Math.cos(angle);
    im += (x[n] as number) * Math.sin(angle);
  }
  return [re, im];
}

describe("realSpectrum", () => {
  for (const size of [4, 8, 16, 64, 256]) {
    it(`realSpectrum(x) of size ${size} matches a naive DFT (reference: textbook DFT)`, () => {
      const noise = seededNoise(size);
      const x = Float64Array.from({ length: size }, () => noise());
      const spectrum = realSpectrum(x);
      for (let k = 0; k <= size / 2; k++) {
        const [re, im] = naiveDft(x, k);
        expect(spectrum[2 * k]).toBeCloseTo(re, 10);
        expect(spectrum[2 * k + 1]).toBeCloseTo(im, 10);
      }
    });
  }

  it("realSpectrum(x) rejects a size that is not a power of two", () => {
    expect(() => realSpectrum(new Float64Array(12))).toThrow(RangeError);
  });
});

describe("spanPhasors", () => {
  it("spanPhasors(x, whole length) equals 2/N times the naive DFT on integer bins (reference: textbook DFT)", () => {
    const size = 200;
    const noise = seededNoise(7);
    const x = Float64Array.from({ length: size }, () => noise());
    const bins = [1, 2, 3, 17, 40, 99];
    const phasors = spanPhasors(x, 0, size, bins.map((k) => (2 * Math.PI * k) / size));
    bins.forEach((k, index) => {
      const [re, im] = naiveDft(x, k);
      expect(phasors[2 * index]).toBeCloseTo((2 * re) / size, 10);
      expect(phasors[2 * index + 1]).toBeCloseTo((2 * im) / size, 10);
    });
  });

  it("spanPhasors(cosine, fractional whole-cycle span) recovers amplitude and phase (closed form)", () => {
    // 7 cycles of 27.3 samples each: the span ends between samples.
    const period = 27.3;
    const x = Float64Array.from({ length: 220 }, (_, n) => 3 * Math.cos((2 * Math.PI * n) / period + 0.8));
    const [re, im] = spanPhasors(x, 0, 7 * period, [(2 * Math.PI) / period]) as unknown as [number, number];
    expect(Math.hypot(re, im)).toBeCloseTo(3, 4);
    expect(Math.atan2(im, re)).toBeCloseTo(0.8, 4);
  });
});
