import { describe, expect, it } from "vitest";
import { computePhasePower, computeTotalPower, neutralCurrentRms } from "@/lib/analysis/power";
import { computePowerReport } from "@/lib/analysis/power-report";
import { analyseChannel } from "@/lib/analysis/channel-metrics";
import { fromPolar } from "@/lib/analysis/phasors";
import type { ChannelRole } from "@/lib/analysis/types";
import { rel } from "./steps";

// IEEE 1459-2010 quantities on cosines of 20 samples a cycle over 5 whole cycles (closed forms by hand).
const window = { start: 0, spanSamples: 100, cycles: 5 };
const cosine = (peak: number, shiftRad: number, order = 1) => Float64Array.from({ length: 100 }, (_, n) => peak * Math.cos((order * 2 * Math.PI * n) / 20 + shiftRad));
const LAG = (2 * Math.PI) / 3;

function phaseAt(thetaRad: number, currentPeak = 10) {
  return computePhasePower(
    {
      voltageId: "van", currentId: "ia", voltage: cosine(100, 0), current: cosine(currentPeak, -thetaRad),
      voltageRms: 100 / Math.SQRT2, currentRms: currentPeak / Math.SQRT2,
      voltageFundamental: { re: 100, im: 0 }, currentFundamental: fromPolar(currentPeak, -thetaRad),
    },
    window,
  );
}

describe("computePhasePower (pins)", () => {
  it("computePhasePower with the current 120° behind: P = P1 = 500·cos 120° = −250 W, Q1 = 500·sin 120° var, S = 500 VA, PF = −0.5", () => {
    const p = phaseAt(LAG);
    expect(rel(p.activePowerW, -250)).toBeLessThan(1e-12);
    expect(rel(p.fundamentalActivePowerW, -250)).toBeLessThan(1e-12);
    expect(rel(p.fundamentalReactivePowerVar, 500 * Math.sin(LAG))).toBeLessThan(1e-12);
    expect(rel(p.apparentPowerVa, 500)).toBeLessThan(1e-12);
    expect(rel(p.fundamentalApparentPowerVa, 500)).toBeLessThan(1e-12);
    expect(rel(p.powerFactor!, -0.5)).toBeLessThan(1e-12);
    expect(rel(p.fundamentalPowerFactor!, -0.5)).toBeLessThan(1e-12);
  });

  it("computePhasePower without current has no power factor (null, not NaN)", () => {
    const p = phaseAt(0, 0);
    expect(p.powerFactor).toBeNull();
    expect(p.fundamentalPowerFactor).toBeNull();
  });
});

describe("computeTotalPower (pins)", () => {
  const phases = [phaseAt(LAG), phaseAt(LAG), phaseAt(LAG)];
  it("computeTotalPower: V_e = √((3·3·230² + 3·(230√3)²)/18) = 230 V, I_e = √((3·10² + 6²)/3), S_e = 3·V_e·I_e", () => {
    const total = computeTotalPower(phases, { lineNeutralRms: [230, 230, 230], lineLineRms: Array(3).fill(230 * Math.sqrt(3)), currentRms: [10, 10, 10], neutralRms: 6 }, null);
    expect(rel(total.effectiveApparentPowerVa, 3 * 230 * Math.sqrt(112))).toBeLessThan(1e-12);
    expect(rel(total.activePowerW, -750)).toBeLessThan(1e-12);
    expect(rel(total.powerFactor!, -750 / (3 * 230 * Math.sqrt(112)))).toBeLessThan(1e-12);
  });

  it("computeTotalPower: P1⁺ = 3·V1⁺·I1⁺·cos θ keeps the sign of cos 120° (−3·(325/√2)(10/√2)/2)", () => {
    const total = computeTotalPower(phases, null, { voltage: { re: 325, im: 0 }, current: fromPolar(10, -LAG) });
    expect(rel(total.positiveSequenceActivePowerW!, (-3 * 325 * 10) / 4)).toBeLessThan(1e-12);
  });

  it("neutralCurrentRms of three balanced currents with an in-phase third harmonic of 2 A peak is 3·2/√2 (closed form)", () => {
    const [a, b, c] = [0, -LAG, LAG].map((s) => Float64Array.from(cosine(10, s), (v, n) => v + cosine(2, 0, 3)[n]!));
    expect(rel(neutralCurrentRms(a!, b!, c!, window), 6 / Math.SQRT2)).toBeLessThan(1e-9);
  });
});

describe("computePowerReport (pins)", () => {
  it("computePowerReport pairs van–ia, vbn–ib, vcn–ic (each phase's P from its own current, by hand)", () => {
    const context = { sampleRateHz: 1000, frequencyHz: 50, window, harmonicWindow: window, maxOrder: 9, groupingIec: false, deviationBasis: "average-cycle" as const };
    const channel = (role: ChannelRole, samples: Float64Array, unit: "V" | "A") => analyseChannel({ id: role, unit, samples }, role, context);
    const analyses = [
      channel("van", cosine(100, 0), "V"), channel("vbn", cosine(100, -LAG), "V"), channel("vcn", cosine(100, LAG), "V"),
      channel("ia", cosine(2, 0), "A"), channel("ib", cosine(4, -LAG), "A"), channel("ic", cosine(6, LAG), "A"),
    ];
    const report = computePowerReport(analyses, null, window, [])!;
    expect(report.phases.map((p) => `${p.voltageId}-${p.currentId}`)).toEqual(["van-ia", "vbn-ib", "vcn-ic"]);
    expect(report.phases.map((p) => Math.round(p.activePowerW * 1e6) / 1e6)).toEqual([100, 200, 300]);
  });
});
