import { describe, expect, it } from "vitest";
import { computeThf, computeTif } from "@/lib/analysis/telephone";
import { thfWeight, tifWeight } from "@/lib/analysis/telephone-weights";
import { nextDown, nextUp, PINS, rel } from "./steps";

// Weights: ITU-T O.41 psophometric table turned into λ = p·f/800 (IEC 60034-1), numpy script; TIF
// weights of IEEE Std 519-1992 Table 10.2 (from memory, as the table in the source says).
describe("telephone weights (pins)", () => {
  it("thfWeight is 1 at 800 Hz and p·f/800 at 50, 4980 and 5000 Hz (numpy script)", () => {
    expect(rel(thfWeight(800), 1)).toBeLessThan(1e-12);
    expect(rel(thfWeight(50), PINS.thfWeight50!)).toBeLessThan(1e-9);
    expect(rel(thfWeight(4980), PINS.thfWeight4980!)).toBeLessThan(1e-9);
    expect(rel(thfWeight(5000), PINS.thfWeight5000!)).toBeLessThan(1e-9);
    expect(thfWeight(nextUp(5000))).toBe(0);
  });

  it("tifWeight reads the table's ends and points and interpolates linearly between them (IEEE 519-1992 Table 10.2)", () => {
    expect(tifWeight(60)).toBe(0.5);
    expect(tifWeight(nextDown(60))).toBe(0);
    expect(tifWeight(1000)).toBe(5000);
    expect(tifWeight(2580)).toBe(10600);
    expect(tifWeight(6000)).toBe(190);
    expect(tifWeight(nextUp(6000))).toBe(0);
    expect(rel(tifWeight(1010), 5050)).toBeLessThan(1e-12);
  });
});

describe("computeThf and computeTif (pins)", () => {
  it("computeThf counts a line exactly at 5 kHz and one at 4980 Hz (IEC 60034-1: components up to 5 kHz)", () => {
    expect(rel(computeThf([{ frequencyHz: 5000, rms: 1 }], 1)!, 100 * PINS.thfWeight5000!)).toBeLessThan(1e-9);
    expect(rel(computeThf([{ frequencyHz: 4980, rms: 1 }], 1)!, 100 * PINS.thfWeight4980!)).toBeLessThan(1e-9);
    expect(computeThf([{ frequencyHz: nextUp(5000), rms: 1 }], 1)).toBe(0);
  });

  it("computeTif of a 1 % component at 1 kHz is 50 (5000 × 0.01, by hand)", () => {
    expect(rel(computeTif([{ frequencyHz: 1000, rms: 0.01 }], 1)!, 50)).toBeLessThan(1e-12);
  });
});
