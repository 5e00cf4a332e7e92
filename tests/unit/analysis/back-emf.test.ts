import { describe, expect, it } from "vitest";
import { MAGNET_COEFFICIENTS_PERCENT_PER_K, analyseCapture, computeBackEmf, keAtReferenceTemperature, polesFromSpeed } from "@/lib/analysis";
import { captureOf, relativeError, synthesise } from "./signals";

describe("computeBackEmf", () => {
  it("computeBackEmf(100 V at 1000 rpm) gives 0.9549 V·s/rad and Kt 1.654 N·m/A (derived check value, DOMAIN §1)", () => {
    const result = computeBackEmf(100, 1000, 8);
    expect(result.keLineRmsPerKrpm).toBeCloseTo(100, 12);
    expect(result.keLineRmsVsPerRad).toBeCloseTo(0.9549, 4);
    expect(result.ktNmPerArms).toBeCloseTo(1.654, 3);
    expect(result.keLinePeakPerKrpm).toBeCloseTo(141.42, 2);
    // V_ph,pk = 100·√2/√3 = 81.65 V at 104.72 rad/s (derived).
    expect(result.kePhasePeakPerRadS).toBeCloseTo(0.77970, 4);
  });

  it("polesFromSpeed gives 4 poles for 50 Hz at 1500 rpm and 60 Hz at 1800 rpm (textbook f = p·n/120, DOMAIN §1)", () => {
    expect(polesFromSpeed(50, 1500)).toBeCloseTo(4, 12);
    expect(polesFromSpeed(60, 1800)).toBeCloseTo(4, 12);
    expect(computeBackEmf(400, 1500, 4).expectedFrequencyHz).toBeCloseTo(50, 12);
  });
});

describe("keAtReferenceTemperature", () => {
  it("keAtReferenceTemperature(NdFeB, 60 °C → 20 °C) divides by 1 − 0.0011·40 (formula and α from memory, DOMAIN §1)", () => {
    expect(MAGNET_COEFFICIENTS_PERCENT_PER_K.ndfeb).toBe(-0.11);
    expect(keAtReferenceTemperature(95.6, 60, 20, -0.11)).toBeCloseTo(100, 10);
    expect(keAtReferenceTemperature(100, 20, 20, -0.2)).toBe(100);
  });
});

describe("analyseCapture back-EMF", () => {
  const fs = 20000;
  const make = (shift: number) => synthesise([{ order: 1, amplitude: 100 * Math.SQRT2 }], 100, fs, 4001, shift);
  const capture = captureOf([{ id: "vab", samples: make(0) }, { id: "vbc", samples: make((-2 * Math.PI) / 3) }, { id: "vca", samples: make((2 * Math.PI) / 3) }], fs);

  it("analyseCapture(speedRpm) gives Ke from the line-line fundamental (closed form: 100 V_LL at 1500 rpm, 8 poles)", () => {
    const report = analyseCapture(capture, { speedRpm: 1500, poles: 8 });
    expect(relativeError(report.backEmf!.keLineRmsPerKrpm, 100 / 1.5)).toBeLessThan(1e-6);
    expect(report.backEmf!.polesFromFrequency).toBeCloseTo(8, 6);
    expect(report.warnings.map((w) => w.code)).not.toContain("poles-not-even");
  });

  it("analyseCapture warns when speed and frequency imply an odd pole count (quality check, DOMAIN §1)", () => {
    const report = analyseCapture(capture, { speedRpm: 2000 });
    expect(report.backEmf!.polesFromFrequency).toBeCloseTo(6, 6);
    const odd = analyseCapture(capture, { speedRpm: 2400 });
    expect(odd.warnings.map((w) => w.code)).toContain("poles-not-even");
  });

  it("analyseCapture states Ke at the reference temperature when a magnet temperature is given (DOMAIN §1, from memory)", () => {
    const report = analyseCapture(capture, { speedRpm: 1500, poles: 8, magnetTemperature: { measuredC: 80, referenceC: 20, material: "smco" } });
    const measured = report.backEmf!.keLineRmsPerKrpm;
    expect(report.backEmf!.referenceTemperatureC).toBe(20);
    expect(report.backEmf!.keLineRmsPerKrpmAtReference).toBeCloseTo(measured / (1 - 0.00035 * 60), 9);
    expect(analyseCapture(capture, { speedRpm: 1500 }).backEmf!.keLineRmsPerKrpmAtReference).toBeNull();
  });

  it("analyseCapture without speed has no back-EMF section (explicit null)", () => {
    expect(analyseCapture(capture, {}).backEmf).toBeNull();
  });
});
