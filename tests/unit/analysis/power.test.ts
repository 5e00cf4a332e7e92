import { describe, expect, it } from "vitest";
import { analyseCapture } from "@/lib/analysis";
import { captureOf, relativeError, synthesise } from "./signals";

describe("analyseCapture power (IEEE 1459 quantities, from memory)", () => {
  const fs = 20000;
  const phi = 0.5; // current lags by 0.5 rad
  const volts = (shift: number) => synthesise([{ order: 1, amplitude: 325 }], 50, fs, 4001, shift);
  const amps = (shift: number) => synthesise([{ order: 1, amplitude: 10, phaseRad: -phi }, { order: 3, amplitude: 2 }], 50, fs, 4001, shift);
  const shifts = [0, (-2 * Math.PI) / 3, (2 * Math.PI) / 3];
  const capture = captureOf(
    [
      ...shifts.map((s, i) => ({ id: ["van", "vbn", "vcn"][i]!, samples: volts(s) })),
      ...shifts.map((s, i) => ({ id: ["ia", "ib", "ic"][i]!, unit: "A" as const, samples: amps(s) })),
    ],
    fs,
  );
  const report = analyseCapture(capture, {});

  it("analyseCapture gives P = V1·I1·cos φ and Q1 = V1·I1·sin φ per phase (closed form)", () => {
    const phase = report.power!.phases[0]!;
    const v1i1 = (325 / Math.SQRT2) * (10 / Math.SQRT2);
    expect(relativeError(phase.activePowerW, v1i1 * Math.cos(phi))).toBeLessThan(1e-5);
    expect(relativeError(phase.fundamentalReactivePowerVar, v1i1 * Math.sin(phi))).toBeLessThan(1e-5);
    expect(phase.fundamentalPowerFactor!).toBeCloseTo(Math.cos(phi), 5);
    // The third harmonic current carries no power but adds to S, so PF < PF1.
    const s = (325 / Math.SQRT2) * Math.sqrt((10 ** 2 + 2 ** 2) / 2);
    expect(relativeError(phase.apparentPowerVa, s)).toBeLessThan(1e-5);
    expect(phase.powerFactor!).toBeLessThan(phase.fundamentalPowerFactor!);
  });

  it("analyseCapture totals three phases and the positive-sequence power (closed form)", () => {
    const total = report.power!.total;
    const v1i1 = (325 / Math.SQRT2) * (10 / Math.SQRT2);
    expect(relativeError(total.activePowerW, 3 * v1i1 * Math.cos(phi))).toBeLessThan(1e-5);
    expect(relativeError(total.positiveSequenceActivePowerW!, 3 * v1i1 * Math.cos(phi))).toBeLessThan(1e-5);
    // Triplen currents add in the neutral: I_e grows, so the effective PF sits below the per-phase PF.
    expect(total.powerFactor!).toBeLessThan(report.power!.phases[0]!.powerFactor!);
  });

  it("analyseCapture has no power section without currents (explicit null)", () => {
    expect(analyseCapture(captureOf([{ id: "van", samples: volts(0) }], fs), {}).power).toBeNull();
  });
});
