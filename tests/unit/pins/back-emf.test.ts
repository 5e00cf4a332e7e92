import { describe, expect, it } from "vitest";
import { computeBackEmf, computeSinglePhaseBackEmf, keAtReferenceTemperature, MAGNET_COEFFICIENTS_PERCENT_PER_K, polesFromSpeed, RAD_PER_S_PER_KRPM } from "@/lib/analysis/back-emf";
import { keInBasis } from "@/lib/analysis/ke-basis";
import type { BackEmfReport } from "@/lib/analysis/report-schema";
import { rel } from "./steps";

// 1500 rpm = 1.5 krpm = 50π rad/s; 3000 rpm = 100π rad/s (closed forms by hand).
describe("computeBackEmf (pins)", () => {
  it("computeBackEmf(400 V line-line RMS, 1500 rpm, 4 poles) gives every basis (DOMAIN §1 conversions, by hand)", () => {
    const r = computeBackEmf(400, 1500, 4);
    const w = 50 * Math.PI;
    expect(rel(RAD_PER_S_PER_KRPM, (100 * Math.PI) / 3)).toBeLessThan(1e-15);
    expect(r.expectedFrequencyHz).toBe(50);
    expect(rel(r.keLineRmsPerKrpm, 400 / 1.5)).toBeLessThan(1e-12);
    expect(rel(r.keLinePeakPerKrpm, (Math.SQRT2 * 400) / 1.5)).toBeLessThan(1e-12);
    expect(rel(r.kePhaseRmsPerKrpm, 400 / 1.5 / Math.sqrt(3))).toBeLessThan(1e-12);
    expect(rel(r.keLineRmsVsPerRad, 400 / w)).toBeLessThan(1e-12);
    expect(rel(r.kePhasePeakPerRadS, (Math.SQRT2 * 400) / Math.sqrt(3) / w)).toBeLessThan(1e-12);
    expect(rel(r.ktNmPerArms, (Math.sqrt(3) * 400) / w)).toBeLessThan(1e-12);
  });

  it("computeSinglePhaseBackEmf(230 V, 3000 rpm, 2 poles) has no √3 anywhere: Kt = E/ω, peak = √2·E/ω (DOMAIN §1)", () => {
    const r = computeSinglePhaseBackEmf(230, 3000, 2);
    const w = 100 * Math.PI;
    expect(r.expectedFrequencyHz).toBe(50);
    expect(rel(r.kePhaseRmsPerKrpm, 230 / 3)).toBeLessThan(1e-12);
    expect(rel(r.ktNmPerArms, 230 / w)).toBeLessThan(1e-12);
    expect(rel(r.kePhasePeakPerRadS, (Math.SQRT2 * 230) / w)).toBeLessThan(1e-12);
  });

  it("polesFromSpeed(50 Hz, 1500 rpm) is 4 (f = p·n/120)", () => {
    expect(polesFromSpeed(50, 1500)).toBe(4);
  });

  it("keAtReferenceTemperature(100, 80 °C, 20 °C, −0.11 %/K) = 100/(1 − 0.066); coefficients NdFeB −0.11, SmCo −0.035, ferrite −0.2 %/K (DOMAIN §1, from memory)", () => {
    expect(rel(keAtReferenceTemperature(100, 80, 20, -0.11), 100 / 0.934)).toBeLessThan(1e-12);
    expect(MAGNET_COEFFICIENTS_PERCENT_PER_K).toEqual({ ndfeb: -0.11, smco: -0.035, ferrite: -0.2 });
  });
});

describe("keInBasis (pins)", () => {
  const report: BackEmfReport = {
    speedRpm: 1500, poles: 4, polesFromFrequency: 4, expectedFrequencyHz: 50, keLineRmsPerKrpm: 100, keLinePeakPerKrpm: 141, kePhasePeakPerRadS: 0.9,
    keLineRmsVsPerRad: 0.95, kePhaseRmsPerKrpm: 57, ktNmPerArms: 1.6, basis: "fundamental", keLineRmsPerKrpmAtReference: 110, referenceTemperatureC: 20,
  };
  it("keInBasis scales each basis by the temperature factor corrected/measured = 1.1 (by hand)", () => {
    expect(rel(keInBasis(report, "line-line-rms-per-krpm")!, 110)).toBeLessThan(1e-12);
    expect(rel(keInBasis(report, "line-line-peak-per-krpm")!, 141 * 1.1)).toBeLessThan(1e-12);
    expect(rel(keInBasis(report, "phase-rms-per-krpm")!, 57 * 1.1)).toBeLessThan(1e-12);
    expect(rel(keInBasis(report, "phase-peak-per-rad-s")!, 0.9 * 1.1)).toBeLessThan(1e-12);
  });

  it("keInBasis takes V_LL/√3 for a report without a phase figure (star equivalent, by hand)", () => {
    const old = { ...report, kePhaseRmsPerKrpm: undefined, keLineRmsPerKrpmAtReference: null };
    expect(rel(keInBasis(old, "phase-rms-per-krpm")!, 100 / Math.sqrt(3))).toBeLessThan(1e-12);
  });
});
