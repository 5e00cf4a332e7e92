import { describe, expect, it } from "vitest";
import { capability, movingRanges, runRules, summariseSeries } from "@/lib/analysis/spc";
import { nextUp, rel } from "./steps";

describe("summariseSeries (pins)", () => {
  it("summariseSeries([10, 12, 11, 13, 12]) against 8..16: x̄ 11.6, s √1.3, MR̄ 1.5, σ = 1.5/1.128, limits x̄ ± 3σ, D4·MR̄, Cp, Cpk (by hand; d2, D4 for n = 2)", () => {
    const s = summariseSeries([10, 12, 11, 13, 12], { lower: 8, upper: 16 })!;
    const sigma = 1.5 / 1.128;
    expect(rel(s.mean, 11.6)).toBeLessThan(1e-12);
    expect(rel(s.sd!, Math.sqrt(1.3))).toBeLessThan(1e-12);
    expect(rel(s.mrBar!, 1.5)).toBeLessThan(1e-12);
    expect(rel(s.sigmaWithin!, sigma)).toBeLessThan(1e-12);
    expect(rel(s.ucl!, 11.6 + 3 * sigma)).toBeLessThan(1e-12);
    expect(rel(s.lcl!, 11.6 - 3 * sigma)).toBeLessThan(1e-12);
    expect(rel(s.mrUcl!, 3.267 * 1.5)).toBeLessThan(1e-12);
    expect(rel(s.cp!, 8 / (6 * sigma))).toBeLessThan(1e-12);
    expect(rel(s.cpk!, 3.6 / (3 * sigma))).toBeLessThan(1e-12);
  });

  it("summariseSeries calls capability indicative below 20 points and not at 20 (edge)", () => {
    const series = (n: number) => Array.from({ length: n }, (_, i) => 10 + (i % 3));
    expect(summariseSeries(series(19), { lower: 0, upper: 20 })!.indicative).toBe(true);
    expect(summariseSeries(series(20), { lower: 0, upper: 20 })!.indicative).toBe(false);
  });
});

describe("runRules edges (pins: Western Electric rules, 'beyond' is strictly beyond)", () => {
  it("runRules rule 1: exactly 3σ is not beyond, one step more is", () => {
    expect(runRules([3], 0, 1)[0]).toEqual([]);
    expect(runRules([nextUp(3)], 0, 1)[0]).toEqual([1]);
    expect(runRules([-nextUp(3)], 0, 1)[0]).toEqual([1]);
  });

  it("runRules rule 2: two of three beyond 2σ, marked on a last point that is itself beyond (exactly 2σ is not)", () => {
    expect(runRules([2.5, 2.5, 2], 0, 1)[2]).toEqual([]);
    expect(runRules([2.5, 0, nextUp(2)], 0, 1)[2]).toEqual([2]);
  });

  it("runRules rule 4: eight on one side, not seven", () => {
    expect(runRules([-0.5, 0.5, 0.5, 0.5, 0.5, 0.5, 0.5, 0.5], 0, 1)[7]).toEqual([]);
    expect(runRules(Array(8).fill(0.5), 0, 1)[7]).toEqual([4]);
  });
});

describe("capability and moving ranges (pins)", () => {
  it("movingRanges are absolute differences and Cpk of a one-sided band takes its one side: (mean − LSL)/(3σ) (by hand)", () => {
    expect(movingRanges([10, 12, 11, 13, 12])).toEqual([2, 1, 2, 1]);
    expect(capability(11, 0.5, { lower: 8, upper: null })).toEqual({ cp: null, cpk: 2 });
    expect(capability(11, 0.5, { lower: null, upper: 14 })).toEqual({ cp: null, cpk: 2 });
  });
});
