import { describe, expect, it } from "vitest";
import { computeHarmonics } from "@/lib/analysis/harmonics";
import { wholeCycleWindow } from "@/lib/analysis/cycles";
import { spanMoments } from "@/lib/analysis/goertzel";
import { computeThd, largestHarmonic } from "@/lib/analysis/thd";
import { analyseCapture } from "@/lib/analysis";
import { reference } from "./fixtures";
import { angleGapDeg, captureOf, relativeError, synthesise } from "./signals";

// Accuracy bars from the issue, clean synthetic signals.
const RMS_RELATIVE = 0.0005; // 0.05 %
const THD_PP = 0.05; // percentage points
const PHASE_DEG = 0.05;

describe("computeHarmonics", () => {
  const fixture = reference.distorted;
  const samples = Float64Array.from(fixture.samples);
  const window = wholeCycleWindow(samples.length, fixture.sampleRateHz, fixture.frequencyHz);

  it("computeHarmonics(distorted fixture) matches numpy rfft magnitudes and phases (numpy fixture)", () => {
    expect(window?.cycles).toBe(fixture.cycles);
    const components = computeHarmonics(samples, fixture.sampleRateHz, fixture.frequencyHz, window!, 20);
    for (const expected of fixture.components) {
      const got = components.find((c) => c.order === expected.order)!;
      expect(Math.abs(got.rms - expected.rms)).toBeLessThan(1e-6 * fixture.components[0]!.rms); // numpy fixture
      if (expected.rms > 1e-3) expect(angleGapDeg(got.phaseDeg, expected.phaseDeg)).toBeLessThan(1e-6); // numpy fixture
    }
  });

  it("computeHarmonics(distorted fixture) squares equal scipy's boxcar periodogram lines (numpy fixture: scipy.signal.periodogram)", () => {
    const components = computeHarmonics(samples, fixture.sampleRateHz, fixture.frequencyHz, window!, 20);
    for (const line of fixture.periodogram) {
      const got = components.find((c) => Math.abs(c.frequencyHz - line.frequencyHz) < 1e-9)!;
      expect(relativeError(got.rms ** 2, line.power)).toBeLessThan(1e-9);
    }
  });

  it("spanMoments(distorted fixture) gives numpy's mean and RMS over the whole cycles (numpy fixture)", () => {
    const { mean, meanSquare } = spanMoments(samples, 0, window!.spanSamples);
    expect(relativeError(Math.sqrt(meanSquare), fixture.rms)).toBeLessThan(1e-12);
    expect(mean).toBeCloseTo(fixture.dc, 10);
  });

  it("computeHarmonics skips orders at or above Nyquist (closed form)", () => {
    const x = synthesise([{ order: 1, amplitude: 1 }], 50, 1000, 1002);
    const window10 = wholeCycleWindow(x.length, 1000, 50)!;
    const orders = computeHarmonics(x, 1000, 50, window10, 50).map((c) => c.order);
    expect(Math.max(...orders)).toBe(9);
  });
});

describe("computeThd", () => {
  it("computeThd(100, [4, 3]) gives THD-F 5.000 % and THD-R 4.9938 % (derived check value, DOMAIN §3)", () => {
    const { thdFPercent, thdRPercent } = computeThd(100, [4, 3]);
    expect(thdFPercent).toBeCloseTo(5.0, 6);
    expect(thdRPercent).toBeCloseTo(4.9938, 4);
  });

  it("computeThd of an ideal square wave's series gives √(π²/8 − 1) = 48.343 % (derived check value, DOMAIN §3)", () => {
    const odd = Array.from({ length: 200000 }, (_, i) => 1 / (2 * i + 3));
    expect(computeThd(1, odd).thdFPercent).toBeCloseTo(48.343, 2);
  });

  it("computeThd with no fundamental is null, not NaN (explicit not-computable)", () => {
    expect(computeThd(0, [1, 2])).toEqual({ thdFPercent: null, thdRPercent: null });
  });

  it("computeThd(distorted fixture) equals numpy's THD-F and THD-R (numpy fixture)", () => {
    const components = reference.distorted.components;
    const { thdFPercent, thdRPercent } = computeThd(components[0]!.rms, components.slice(1).map((c) => c.rms));
    expect(thdFPercent).toBeCloseTo(reference.distorted.thdFPercent, 9);
    expect(thdRPercent).toBeCloseTo(reference.distorted.thdRPercent, 9);
  });

  it("largestHarmonic picks the biggest single harmonic in percent (closed form)", () => {
    expect(largestHarmonic(200, [{ order: 3, rms: 2 }, { order: 5, rms: 6 }])).toEqual({ order: 5, percent: 3 });
  });
});

describe("analyseCapture harmonic accuracy", () => {
  it("analyseCapture(off-bin distorted sine) meets the RMS, THD and phase bars (closed form, tolerances from the issue)", () => {
    const fs = 9876.5;
    const f = 49.37;
    const tones = [
      { order: 1, amplitude: 300, phaseRad: 0.3 },
      { order: 3, amplitude: 9, phaseRad: -1 },
      { order: 5, amplitude: 12, phaseRad: 2 },
      { order: 7, amplitude: 6, phaseRad: 0.5 },
      { order: 13, amplitude: 2, phaseRad: -2.2 },
    ];
    const x = synthesise(tones, f, fs, Math.round((fs / f) * 12.4));
    const report = analyseCapture(captureOf([{ id: "V", samples: x }], fs), { harmonics: 40 });
    const channel = report.channels[0]!;
    const rmsTrue = Math.sqrt(tones.reduce((sum, t) => sum + t.amplitude ** 2 / 2, 0));
    const thdTrue = (100 * Math.sqrt(tones.slice(1).reduce((sum, t) => sum + t.amplitude ** 2, 0))) / 300;
    expect(relativeError(channel.rms, rmsTrue)).toBeLessThan(RMS_RELATIVE);
    expect(Math.abs(channel.thdFPercent! - thdTrue)).toBeLessThan(THD_PP);
    expect(angleGapDeg(channel.fundamental.phaseDeg, (0.3 * 180) / Math.PI)).toBeLessThan(PHASE_DEG);
    const fifth = channel.harmonics.find((h) => h.order === 5)!;
    expect(relativeError(fifth.rms, 12 / Math.SQRT2)).toBeLessThan(RMS_RELATIVE);
  });
});
