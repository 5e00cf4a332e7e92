import { describe, expect, it } from "vitest";
import { analyseCapture, keInBasis, profileFromPreset, ratingSchema } from "@/lib/analysis";
import { captureOf, relativeError, synthesise } from "./signals";

describe("analyseCapture bases that follow the rating", () => {
  it("analyseCapture judges TIF for a 60 Hz rating even when the capture runs at 40 Hz (the rating decides, not the measured frequency)", () => {
    const rating = ratingSchema.parse({
      machineKind: "wound-field-alternator", nominalVoltageV: 480, voltageBasis: "line-line-rms", frequencyHz: 60, phases: 3, connection: "star", poles: 4, ratedSpeedRpm: 1800,
    });
    const profile = profileFromPreset("lab-own", rating);
    expect(profile.checks.tif.required).toBe(true);
    const f = 40;
    const line = (shift: number) => synthesise([{ order: 1, amplitude: 320 * Math.SQRT2 }, { order: 11, amplitude: 0.002 * 320 * Math.SQRT2 }], f, 20000, 5001, shift);
    const report = analyseCapture(captureOf([{ id: "vab", samples: line(0) }, { id: "vbc", samples: line((-2 * Math.PI) / 3) }, { id: "vca", samples: line((2 * Math.PI) / 3) }], 20000), { rating, profile, speedRpm: 1200 });
    const tif = report.verdicts.find((v) => v.check === "tif")!;
    expect(tif.measured).not.toBeNull();
    expect(["pass", "marginal"]).toContain(tif.status);
  });

  it("analyseCapture states a single-phase machine's Ke per phase from its one winding, without √3 (DOMAIN §1: V_ph per krpm)", () => {
    const rating = ratingSchema.parse({
      machineKind: "pm-generator", nominalVoltageV: 230, voltageBasis: "line-neutral-rms", frequencyHz: 50, phases: 1, connection: "single", poles: 4, ratedSpeedRpm: 1500,
      ke: { value: 230 / 1.5, basis: "phase-rms-per-krpm" },
    });
    const profile = profileFromPreset("lab-own", rating);
    const winding = synthesise([{ order: 1, amplitude: 230 * Math.SQRT2 }], 50, 20000, 4001);
    const report = analyseCapture(captureOf([{ id: "v", samples: winding }], 20000), { rating, profile, speedRpm: 1500 });
    // 230 V RMS at 1.5 krpm: 153.33 V/krpm per phase (closed form).
    expect(relativeError(report.backEmf!.kePhaseRmsPerKrpm!, 230 / 1.5)).toBeLessThan(1e-6);
    expect(relativeError(keInBasis(report.backEmf, "phase-rms-per-krpm")!, 230 / 1.5)).toBeLessThan(1e-6);
    // Phase peak per rad/s: √2·230 / (1500·2π/60) = 2.0707 V·s/rad (closed form).
    expect(relativeError(report.backEmf!.kePhasePeakPerRadS, (Math.SQRT2 * 230) / ((1500 * 2 * Math.PI) / 60))).toBeLessThan(1e-6);
    expect(report.verdicts.find((v) => v.check === "back-emf-constant")!.status).toBe("pass");
    expect(report.warnings.map((w) => w.code)).toContain("back-emf-single-phase");
  });

  it("keInBasis takes V_LL/√3 as the phase RMS of a three-phase report and of reports without the phase figure (star equivalent, DOMAIN §1)", () => {
    const backEmf = { speedRpm: 1500, poles: 4, polesFromFrequency: 4, expectedFrequencyHz: 50, keLineRmsPerKrpm: 300, keLinePeakPerKrpm: 300 * Math.SQRT2, kePhasePeakPerRadS: 1, keLineRmsVsPerRad: 1, ktNmPerArms: 1, basis: "fundamental" as const };
    expect(keInBasis(backEmf, "phase-rms-per-krpm")).toBeCloseTo(300 / Math.sqrt(3), 10);
    expect(keInBasis({ ...backEmf, kePhaseRmsPerKrpm: 170 }, "phase-rms-per-krpm")).toBe(170);
  });
});
