import { readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { capability, D2, D4, movingRanges, runRules, summariseSeries, type RunRule } from "@/lib/analysis";

// Reference: numpy, tests/fixtures/trends/spc.json written by scripts/fixtures/make_spc_fixture.py.
type Case = {
  name: string; values: number[]; band: { lower: number | null; upper: number | null };
  n: number; mean: number; sd: number; mrBar: number; sigmaWithin: number; ucl: number; lcl: number; mrUcl: number;
  cp: number | null; cpk: number | null; indicative: boolean; rules: RunRule[][];
};
const fixture = JSON.parse(readFileSync(path.join(import.meta.dirname, "../../fixtures/trends/spc.json"), "utf8")) as { cases: Case[] };

/** Relative agreement to 1e-9: far tighter than the 0.1 % change a mutated formula would make. */
const close = (actual: number | null | undefined, expected: number | null) => {
  if (expected === null) return expect(actual).toBeNull();
  expect(actual).not.toBeNull();
  expect(Math.abs((actual as number) - expected)).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(expected)));
};

describe("summariseSeries against numpy (spc.json)", () => {
  for (const c of fixture.cases) {
    it(`summariseSeries: ${c.name}`, () => {
      const s = summariseSeries(c.values, c.band);
      expect(s).not.toBeNull();
      if (!s) return;
      expect(s.n).toBe(c.n);
      close(s.mean, c.mean); // numpy mean
      close(s.sd, c.sd); // numpy std(ddof=1)
      close(s.mrBar, c.mrBar); // numpy mean(abs(diff))
      close(s.sigmaWithin, c.sigmaWithin); // MRbar / 1.128 (DOMAIN §14)
      close(s.ucl, c.ucl); // mean + 3 sigma within
      close(s.lcl, c.lcl);
      close(s.mrUcl, c.mrUcl); // 3.267 MRbar (DOMAIN §14)
      close(s.cp, c.cp); // (USL - LSL) / 6 sigma
      close(s.cpk, c.cpk); // min(USL - mean, mean - LSL) / 3 sigma
      expect(s.indicative).toBe(c.indicative);
      expect(s.rules).toEqual(c.rules); // window counts in numpy
    });
  }

  it("summariseSeries: the fixture's series break every run rule somewhere (so the rule checks can fail)", () => {
    const seen = new Set(fixture.cases.flatMap((c) => c.rules.flat()));
    expect([...seen].sort()).toEqual([1, 2, 3, 4]);
  });
});

describe("I-MR constants and small cases", () => {
  it("D2 and D4: the control-chart constants for subgroups of two (DOMAIN §14)", () => {
    expect(D2).toBe(1.128);
    expect(D4).toBe(3.267);
  });

  it("summariseSeries: limits are mean ± 2.66·MR̄ to the rounding of 3/1.128 (DOMAIN §14)", () => {
    const s = summariseSeries([10, 12, 11, 13, 12], { lower: 5, upper: 15 });
    // MR = 2, 1, 2, 1 → MR̄ = 1.5; mean 11.6 (hand computation).
    expect(s?.mrBar).toBeCloseTo(1.5, 12);
    expect(s?.ucl).toBeCloseTo(11.6 + (3 / 1.128) * 1.5, 12);
    expect(Math.abs((s?.ucl as number) - (11.6 + 2.66 * 1.5))).toBeLessThan(0.001);
    expect(s?.indicative).toBe(true);
  });

  it("summariseSeries: one point has a mean but no spread, limits or capability", () => {
    const s = summariseSeries([2.01], { lower: null, upper: 5 });
    expect(s).toMatchObject({ n: 1, mean: 2.01, sd: null, mrBar: null, ucl: null, cp: null, cpk: null, rules: [[]] });
    expect(summariseSeries([], { lower: null, upper: 5 })).toBeNull();
  });

  it("summariseSeries: identical points give σ = 0, so no capability and no rules", () => {
    const s = summariseSeries([50, 50, 50, 50], { lower: 49.5, upper: 50.5 });
    expect(s).toMatchObject({ sigmaWithin: 0, cp: null, cpk: null, rules: [[], [], [], []] });
  });

  it("capability: a one-sided band gives Cpk from its side and no Cp (DOMAIN §14)", () => {
    // (5 − 2)/(3·0.5) = 2 (hand computation).
    expect(capability(2, 0.5, { lower: null, upper: 5 })).toEqual({ cp: null, cpk: 2 });
    expect(capability(2, 0.5, { lower: 1, upper: null })).toEqual({ cp: null, cpk: 2 / 3 });
  });

  it("movingRanges and runRules: eight in a row above the centre completes rule 4 on the eighth (DOMAIN §14)", () => {
    expect(movingRanges([1, 3, 2])).toEqual([2, 1]);
    const rules = runRules([0.5, 0.5, 0.5, 0.5, 0.5, 0.5, 0.5, 0.5], 0, 1);
    expect(rules.map((r) => r.includes(4))).toEqual([false, false, false, false, false, false, false, true]);
    // Two of three beyond 2σ on one side; a point beyond 2σ on the other side does not count.
    expect(runRules([2.5, -2.5, 2.5], 0, 1)[2]).toEqual([2]);
    expect(runRules([2.5, 0, -2.5], 0, 1)[2]).toEqual([]);
  });
});
