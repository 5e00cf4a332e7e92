import { describe, expect, it } from "vitest";
import { combine, describeUncertainty, evaluateUncertainty, type FigureUncertainty, type UncertaintyInstrument } from "@/lib/analysis";

// Worked example, derived by hand (GUM, JCGM 100:2008 §4.3.7 rectangular u = a/√3, §5.1.2 combination,
// §6.2 U = k·u_c with k = 2). Instruments (invented):
//   scope  SC-1: gain ±1.5 % of reading, offset ±0.1 V, timebase ±25 ppm
//   probe  VP-1: gain ±1 % of reading
//   tacho  TA-1: ±0.05 % of reading, ±1 rpm
// RMS voltage 400 V:
//   scope gain  a = 400 × 1.5 % = 6 V      u = 6/√3   = 3.464102 V  u² = 12
//   scope offset a = 0.1 V                 u = 0.1/√3 = 0.057735 V  u² = 0.0033333
//   probe gain  a = 400 × 1 %   = 4 V      u = 4/√3   = 2.309401 V  u² = 5.3333333
//   u_c = √17.3366667 = 4.163733 V, U = 2 × u_c = 8.327467 V (2.0819 % of 400 V)
// Frequency 50 Hz: a = 50 × 25e-6 = 1.25e-3 Hz, u = 7.216878e-4 Hz, U = 1.443376e-3 Hz.
// Ke 160 V/krpm from V = 400 V at n = 2500 rpm (Ke = V/n ×1000):
//   c_V = Ke/V = 0.4 (V/krpm)/V  → voltage part 0.4 × 4.163733 = 1.665493; squared 2.7738667
//   c_n = −Ke/n = −0.064 (V/krpm)/rpm
//   tacho gain  a = 2500 × 0.05 % = 1.25 rpm, u = 0.7216878 rpm → 0.046188; squared 0.0021333
//   tacho offset a = 1 rpm,                 u = 0.5773503 rpm → 0.036950; squared 0.0013653
//   u_c = √2.7773653 = 1.666543, U = 3.333087 V/krpm
const scope: UncertaintyInstrument = { assetTag: "SC-1", kind: "oscilloscope", channel: "", spec: { gainPercentOfReading: 1.5, offset: 0.1, offsetUnit: "V", timebasePpm: 25 } };
const probe: UncertaintyInstrument = { assetTag: "VP-1", kind: "voltage-probe", channel: "", spec: { gainPercentOfReading: 1 } };
const tacho: UncertaintyInstrument = { assetTag: "TA-1", kind: "tachometer", channel: "", spec: { speedPercentOfReading: 0.05, speedOffsetRpm: 1 } };
const inputs = {
  voltage: { value: 400, unit: "V", channels: ["vab", "vbc", "vca"] },
  frequency: { value: 50, unit: "Hz" },
  ke: { value: 160, unit: "V/krpm", voltageV: 400, speedRpm: 2500, channels: ["vab", "vbc", "vca"] },
};
const REL = 1e-6; // far tighter than the 0.1 % a changed formula would move U
const near = (actual: number, expected: number) => expect(Math.abs(actual - expected) / expected).toBeLessThan(REL);
const evaluated = (all: FigureUncertainty[], check: string) => {
  const u = all.find((f) => f.check === check);
  if (u?.status !== "evaluated") throw new Error(`${check} not evaluated`);
  return u;
};

describe("evaluateUncertainty", () => {
  const all = evaluateUncertainty(inputs, [scope, probe, tacho]);

  it("evaluateUncertainty gives the hand-worked RMS voltage budget (worked example above)", () => {
    const v = evaluated(all, "voltage");
    near(v.standardUncertainty, 4.163733);
    near(v.expandedUncertainty, 8.327467);
    near(v.relativePercent, 2.0818667);
    expect(v.coverageFactor).toBe(2);
    expect(v.contributions.map((c) => c.value)).toEqual([6, 0.1, 4]);
    near(v.contributions[0]!.standardUncertainty, 3.464102);
    near(v.contributions[0]!.divisor, Math.sqrt(3));
    near(v.contributions[0]!.share, 12 / 17.3366667);
    near(v.contributions[2]!.share, 5.3333333 / 17.3366667);
    expect(v.contributions.reduce((s, c) => s + c.share, 0)).toBeCloseTo(1, 12);
  });

  it("evaluateUncertainty gives the hand-worked frequency budget from the timebase (worked example above)", () => {
    const f = evaluated(all, "frequency");
    near(f.standardUncertainty, 7.216878e-4);
    near(f.expandedUncertainty, 1.443376e-3);
  });

  it("evaluateUncertainty gives the hand-worked Ke budget with voltage and speed sensitivities (worked example above)", () => {
    const ke = evaluated(all, "back-emf-constant");
    near(ke.standardUncertainty, 1.666543);
    near(ke.expandedUncertainty, 3.333087);
    const speed = ke.contributions.find((c) => c.name.includes("TA-1") && c.unit === "rpm" && c.value === 1.25)!;
    near(speed.sensitivity, -0.064);
    near(speed.standardUncertainty, 0.046188);
  });

  it("evaluateUncertainty says not evaluated (never zero) without instruments", () => {
    const none = evaluateUncertainty(inputs, []);
    expect(none.map((f) => f.status)).toEqual(["not-evaluated", "not-evaluated", "not-evaluated"]);
    expect(describeUncertainty(none[0])).toBe("not evaluated");
  });

  it("evaluateUncertainty leaves Ke not evaluated without a tachometer, and frequency without a timebase", () => {
    const some = evaluateUncertainty(inputs, [probe]);
    expect(some.find((f) => f.check === "back-emf-constant")).toMatchObject({ status: "not-evaluated", reason: expect.stringContaining("tachometer") });
    expect(some.find((f) => f.check === "frequency")).toMatchObject({ status: "not-evaluated", reason: expect.stringContaining("timebase") });
    near(evaluated(some, "voltage").expandedUncertainty, 2 * 4 / Math.sqrt(3)); // probe only: U = 2 × 4/√3 (hand)
  });

  it("evaluateUncertainty applies a probe recorded on one channel only to figures drawn from that channel", () => {
    const onOther = { ...probe, channel: "ia" };
    near(evaluated(evaluateUncertainty(inputs, [scope, onOther]), "voltage").expandedUncertainty, 2 * Math.sqrt(12 + 0.01 / 3)); // scope only (hand)
  });

  it("evaluateUncertainty refuses a negative accuracy with the field named", () => {
    expect(() => evaluateUncertainty(inputs, [{ ...scope, spec: { gainPercentOfReading: -1 } }])).toThrow(/Gain accuracy cannot be negative/);
  });
});

describe("combine", () => {
  it("combine adds rectangular terms in quadrature with sensitivities (u = |c|·a/√3, GUM §5.1.2)", () => {
    const r = combine([{ name: "a", value: 3, unit: "V", sensitivity: 2 }, { name: "b", value: 4, unit: "V", sensitivity: -1 }]);
    // (2·3/√3)² + (4/√3)² = 12 + 16/3 = 17.333333; u_c = 4.163332; U = 8.326664 (hand)
    near(r.standardUncertainty, 4.163332);
    near(r.expandedUncertainty, 8.326664);
  });

  it("describeUncertainty words U with its relative value and k", () => {
    expect(describeUncertainty(evaluated(evaluateUncertainty(inputs, [scope, probe, tacho]), "voltage"))).toBe("± 8.3 V (2.1 %, k = 2)");
  });
});
