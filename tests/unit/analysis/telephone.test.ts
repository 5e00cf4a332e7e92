import { describe, expect, it } from "vitest";
import { computeThf, computeTif } from "@/lib/analysis";
import { interpolateTable, thfWeight, tifWeight } from "@/lib/analysis/telephone-weights";

describe("computeTif", () => {
  it("computeTif of a single 1 % component at 1 kHz is 50 (derived check value, DOMAIN §4; weights from memory)", () => {
    expect(computeTif([{ frequencyHz: 1000, rms: 1 }], 100)).toBeCloseTo(50, 12);
  });
  it("computeTif with no RMS is null (explicit not-computable)", () => {
    expect(computeTif([{ frequencyHz: 1000, rms: 1 }], 0)).toBeNull();
  });
});

describe("computeThf", () => {
  it("thfWeight is 1 at 800 Hz, where the psophometric curve is referenced (ITU-T O.41 reference point, from memory)", () => {
    expect(thfWeight(800)).toBeCloseTo(1, 12);
  });
  it("computeThf weights a single component by λ(f)·U_f/U (definition IEC 60034-1, from memory)", () => {
    const lambda = thfWeight(1000);
    expect(computeThf([{ frequencyHz: 1000, rms: 2 }], 100)).toBeCloseTo(2 * lambda, 12);
    expect(computeThf([{ frequencyHz: 6000, rms: 2 }], 100)).toBe(0);
  });
  it("tifWeight interpolates between table points and is 0 outside the table (data table, from memory)", () => {
    expect(tifWeight(1000)).toBe(5000);
    expect(tifWeight(10)).toBe(0);
    expect(interpolateTable([[0, 0], [10, 100]], 2.5, -1)).toBe(25);
  });
});
