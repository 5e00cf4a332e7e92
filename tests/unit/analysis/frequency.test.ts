import { describe, expect, it } from "vitest";
import { estimateBySpectrum, estimateByZeroCrossings, refineFrequency } from "@/lib/analysis/frequency";
import { analyseCapture } from "@/lib/analysis";
import { reference } from "./fixtures";
import { captureOf, relativeError, seededNoise, synthesise } from "./signals";

const FREQUENCY_RELATIVE = 1e-4; // 0.01 % with at least 5 cycles, from the issue

describe("frequency estimation", () => {
  const cases = [
    { f: 50.0, fs: 10000, cycles: 5.3 },
    { f: 59.87, fs: 7321, cycles: 6.1 },
    { f: 413.7, fs: 96000, cycles: 40 },
    { f: 49.9912, fs: 50000, cycles: 500 },
  ];
  for (const { f, fs, cycles } of cases) {
    it(`refineFrequency recovers ${f} Hz at ${fs} S/s from ${cycles} cycles within 0.01 % (closed form)`, () => {
      const x = synthesise(
        [
          { order: 1, amplitude: 100, phaseRad: 1.1 },
          { order: 5, amplitude: 4, phaseRad: 0.2 },
          { order: 7, amplitude: 3, phaseRad: -0.4 },
        ],
        f,
        fs,
        Math.round((cycles * fs) / f),
      );
      const crossings = estimateByZeroCrossings(x, fs, 0, 100);
      const coarse = estimateBySpectrum(x, fs, 0) ?? crossings!.frequencyHz;
      expect(relativeError(refineFrequency(x, fs, coarse), f)).toBeLessThan(FREQUENCY_RELATIVE);
      expect(relativeError(crossings!.frequencyHz, f)).toBeLessThan(1e-3);
    });
  }

  it("analyseCapture frequency agrees with scipy's four-parameter curve_fit on a noisy sine (numpy fixture: scipy.optimize.curve_fit)", () => {
    const fixture = reference.sineFit;
    const report = analyseCapture(captureOf([{ id: "V", samples: Float64Array.from(fixture.samples) }], fixture.sampleRateHz), {});
    expect(relativeError(report.frequencyHz, fixture.fitFrequencyHz)).toBeLessThan(FREQUENCY_RELATIVE);
    expect(relativeError(report.frequencyHz, fixture.trueFrequencyHz)).toBeLessThan(FREQUENCY_RELATIVE);
  });

  it("refineFrequency holds 0.01 % under 1 % noise and a DC offset (closed form with seeded noise)", () => {
    const noise = seededNoise(42);
    const fs = 20000;
    const f = 50.37;
    const x = synthesise([{ order: 0, amplitude: 5 }, { order: 1, amplitude: 100 }], f, fs, 3000).map((v) => v + 2 * noise());
    const report = analyseCapture(captureOf([{ id: "V", samples: x }], fs), {});
    expect(relativeError(report.frequencyHz, f)).toBeLessThan(FREQUENCY_RELATIVE);
  });

  it("estimateByZeroCrossings returns null for a flat record (explicit not-computable)", () => {
    expect(estimateByZeroCrossings(new Float64Array(100), 1000, 0, 0)).toBeNull();
  });
});
