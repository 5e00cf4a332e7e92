import { describe, expect, it } from "vitest";
import { analyseChannel, type ChannelAnalysis } from "@/lib/analysis/channel-metrics";
import { analyseThreePhase } from "@/lib/analysis/three-phase";
import { computeMaxDeviationUnbalance, computeVuf, computeVufFromLineMagnitudes } from "@/lib/analysis/sequence";
import type { ChannelRole } from "@/lib/analysis/types";
import { PINS, rel } from "./steps";

const fs = 1000;
const window = { start: 0, spanSamples: 100, cycles: 5 };
const context = { sampleRateHz: fs, frequencyHz: 50, window, harmonicWindow: window, maxOrder: 9, groupingIec: false, deviationBasis: "average-cycle" as const };
const phase = (peak: number, shiftRad: number) => Float64Array.from({ length: 100 }, (_, n) => peak * Math.cos((2 * Math.PI * n) / 20 + shiftRad));
const analysed = (channels: [ChannelRole, Float64Array][]): ChannelAnalysis[] =>
  channels.map(([role, samples]) => analyseChannel({ id: role, unit: "V", samples }, role, context));

describe("analyseThreePhase (pins)", () => {
  it("analyseThreePhase derives v_ab of a balanced 325 V-peak set as 325·√3/√2 V RMS, fundamental and true RMS (closed form)", () => {
    const result = analyseThreePhase(analysed([["van", phase(325, 0)], ["vbn", phase(325, (-2 * Math.PI) / 3)], ["vcn", phase(325, (2 * Math.PI) / 3)]]), window)!;
    const expected = (325 * Math.sqrt(3)) / Math.SQRT2;
    for (const line of result.report.lineToLine) {
      expect(rel(line.fundamentalRms, expected)).toBeLessThan(1e-9);
      expect(rel(line.rms, expected)).toBeLessThan(1e-9);
    }
    expect(result.report.unbalance.ieeePercent).not.toBeNull();
    expect(result.report.unbalance.ieeePercent!).toBeLessThan(1e-9);
  });

  it("analyseThreePhase of one live phase: V0 = V1 = V2 = V/3, a tie that reads positive (Fortescue by hand)", () => {
    const zero = new Float64Array(100);
    const report = analyseThreePhase(analysed([["van", phase(300, 0)], ["vbn", zero], ["vcn", zero]]), window)!.report;
    const third = 300 / 3 / Math.SQRT2;
    expect(rel(report.sequenceComponents.zero, third)).toBeLessThan(1e-9);
    expect(rel(report.sequenceComponents.positive, third)).toBeLessThan(1e-9);
    expect(rel(report.sequenceComponents.negative, third)).toBeLessThan(1e-9);
    expect(report.sequence).toBe("positive");
  });
});

describe("unbalance (pins)", () => {
  it("computeMaxDeviationUnbalance([460, 467, 450]) is 100·9/459 % (NEMA MG 1 worked example, by hand)", () => {
    expect(rel(computeMaxDeviationUnbalance([460, 467, 450])!, PINS.nema_460_467_450!)).toBeLessThan(1e-12);
  });

  it("computeVufFromLineMagnitudes(460, 467, 450) equals |V2|/|V1| of the closed triangle (numpy Fortescue)", () => {
    expect(rel(computeVufFromLineMagnitudes(460, 467, 450)!, PINS.vuf_460_467_450!)).toBeLessThan(1e-9);
  });
});

describe("displacement and VUF edges (pins)", () => {
  it("analyseThreePhase gives +120° for ab, bc and ca of a positive-sequence set (a leads b leads c leads a)", () => {
    const result = analyseThreePhase(analysed([["van", phase(325, 0)], ["vbn", phase(325, (-2 * Math.PI) / 3)], ["vcn", phase(325, (2 * Math.PI) / 3)]]), window)!;
    for (const d of Object.values(result.report.displacementDeg)) expect(Math.abs(d - 120)).toBeLessThan(1e-9);
  });

  it("computeVuf is not computable without a positive sequence (null), and 100·|V2|/|V1| otherwise", () => {
    expect(computeVuf({ re: 0, im: 0 }, { re: 1, im: 0 })).toBeNull();
    expect(rel(computeVuf({ re: 0, im: 200 }, { re: 3, im: 4 })!, 2.5)).toBeLessThan(1e-12);
  });
});
