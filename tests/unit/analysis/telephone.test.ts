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
  it("the psophometric table matches ITU-T O.41 at the published points (as reproduced in TIA-470.120-C, Annex A, Table A.1)", () => {
    const published: [number, number][] = [
      [50, -63.0], [100, -41.0], [200, -21.0], [300, -10.6], [400, -6.3], [500, -3.6], [600, -2.0], [700, -0.9],
      [800, 0.0], [900, 0.6], [1000, 1.0], [1200, 0.0], [1400, -0.9], [1600, -1.7], [1800, -2.4], [2000, -3.0],
      [2500, -4.2], [3000, -5.6], [3500, -8.5], [4000, -15.0], [4500, -25.0], [5000, -36.0],
    ];
    for (const [f, db] of published) expect(thfWeight(f), `${f} Hz`).toBeCloseTo(10 ** (db / 20) * (f / 800), 12);
    // Derived by hand: λ(300 Hz) = 10^(−10.6/20)·300/800 = 0.29512·0.375 = 0.110671.
    expect(thfWeight(300)).toBeCloseTo(0.110671, 5);
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
