import { describe, expect, it } from "vitest";
import { combine, COVERAGE_FACTOR, evaluateUncertainty } from "@/lib/analysis/uncertainty";
import { PINS, rel } from "./steps";

// GUM (JCGM 100:2008 §4.3.7): a limit ±a read as rectangular gives u = a/√3; u_c = √Σ(c_i·u_i)²; U = k·u_c.
describe("combine (pins)", () => {
  it("combine(±1.2 with c = 1, ±0.9 with c = −2): u_c = √((1.44 + 3.24)/3) = √1.56, U = 2√1.56, shares 1.44/4.68 and 3.24/4.68 (by hand)", () => {
    const r = combine([{ name: "a", value: 1.2, unit: "V", sensitivity: 1 }, { name: "b", value: 0.9, unit: "V", sensitivity: -2 }]);
    expect(COVERAGE_FACTOR).toBe(2);
    expect(rel(r.standardUncertainty, Math.sqrt(1.56))).toBeLessThan(1e-12);
    expect(rel(r.expandedUncertainty, 2 * Math.sqrt(1.56))).toBeLessThan(1e-12);
    expect(rel(r.contributions[0]!.divisor, 1.7320508075688772)).toBeLessThan(1e-15);
    expect(rel(r.contributions[1]!.standardUncertainty, 1.8 / Math.sqrt(3))).toBeLessThan(1e-12);
    expect(rel(r.contributions[0]!.share, 1.44 / 4.68)).toBeLessThan(1e-12);
    expect(rel(r.contributions[1]!.share, 3.24 / 4.68)).toBeLessThan(1e-12);
  });
});

describe("evaluateUncertainty (pins)", () => {
  const instruments = [
    { assetTag: "S1", kind: "oscilloscope" as const, spec: { gainPercentOfReading: 1, offset: 0.1, timebasePpm: 20 } },
    { assetTag: "D1", kind: "daq" as const, spec: { timebasePpm: 50 } },
    { assetTag: "T1", kind: "tachometer" as const, spec: { speedPercentOfReading: 0.1, speedOffsetRpm: 1 } },
  ];
  const figures = evaluateUncertainty(
    {
      voltage: { value: 400, unit: "V", channels: ["vab"] },
      frequency: { value: 50, unit: "Hz" },
      ke: { value: 400 / 1.5, unit: "V/krpm", voltageV: 400, speedRpm: 1500, channels: ["vab"] },
    },
    instruments,
  );
  const u = (check: string) => figures.find((f) => f.check === check) as Extract<(typeof figures)[number], { status: "evaluated" }>;

  it("evaluateUncertainty: 400 V with gain 1 % and offset 0.1 V gives U = 2·√((4² + 0.1²)/3) V, 1.155 % (numpy script)", () => {
    expect(rel(u("voltage").expandedUncertainty, PINS.voltageExpandedUncertainty!)).toBeLessThan(1e-12);
    expect(rel(u("voltage").relativePercent, (100 * PINS.voltageExpandedUncertainty!) / 400)).toBeLessThan(1e-12);
  });

  it("evaluateUncertainty takes the least accurate sampling clock: 50 ppm of 50 Hz, U = 2·0.0025/√3 Hz (by hand)", () => {
    expect(rel(u("frequency").expandedUncertainty, (2 * 0.0025) / Math.sqrt(3))).toBeLessThan(1e-12);
  });

  it("evaluateUncertainty for Ke = V/n: c_V = Ke/V, c_n = −Ke/n over gain, offset and both speed terms (numpy script)", () => {
    expect(rel(u("back-emf-constant").expandedUncertainty, PINS.keExpandedUncertainty!)).toBeLessThan(1e-12);
  });
});
