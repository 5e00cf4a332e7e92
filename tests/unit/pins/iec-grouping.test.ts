import { describe, expect, it } from "vitest";
import { computeHarmonicGroups } from "@/lib/analysis/iec-grouping";
import { rel } from "./steps";

// IEC 61000-4-7 grouping over 10-cycle windows at 50 Hz (lines every 5 Hz, M = 10): G_h² =
// ½C²_{k−5} + Σ_{|i|<5} C²_{k+i} + ½C²_{k+5}. A 75 Hz interharmonic sits on line 15, the shared edge
// of groups 1 and 2, so half its power goes to each (closed form). 200 samples a cycle, 20 cycles.
const fs = 10000;
const tone = (count: number) =>
  Float64Array.from({ length: count }, (_, n) => 100 * Math.cos((2 * Math.PI * 50 * n) / fs) + 6 * Math.cos((2 * Math.PI * 100 * n) / fs) + 8 * Math.cos((2 * Math.PI * 75 * n) / fs));

describe("computeHarmonicGroups (pins)", () => {
  it("computeHarmonicGroups splits a line on a group edge half and half: G1² = 100²/2 + ½·8²/2, G2² = 6²/2 + ½·8²/2", () => {
    const groups = computeHarmonicGroups(tone(4000), fs, 50, { start: 0, spanSamples: 4000, cycles: 20 }, 3)!;
    expect(rel(groups[0]!.rms, Math.sqrt(100 ** 2 / 2 + 8 ** 2 / 4))).toBeLessThan(1e-9);
    expect(rel(groups[1]!.rms, Math.sqrt(6 ** 2 / 2 + 8 ** 2 / 4))).toBeLessThan(1e-9);
    expect(groups[2]!.rms).toBeLessThan(1e-9);
  });

  it("computeHarmonicGroups needs one whole 10-cycle window at 50 Hz: 10 cycles give a result, 9 none (edge)", () => {
    expect(computeHarmonicGroups(tone(2000), fs, 50, { start: 0, spanSamples: 2000, cycles: 10 }, 3)).not.toBeNull();
    expect(computeHarmonicGroups(tone(2000), fs, 50, { start: 0, spanSamples: 1800, cycles: 9 }, 3)).toBeNull();
  });

  it("computeHarmonicGroups takes 12-cycle windows from 55 Hz on: 11 cycles of 55 Hz are too few (edge of the 50/60 Hz split)", () => {
    const samples = Float64Array.from({ length: 4000 }, (_, n) => Math.cos((2 * Math.PI * 55 * n) / fs));
    const cycles11 = { start: 0, spanSamples: (11 * fs) / 55, cycles: 11 };
    expect(computeHarmonicGroups(samples, fs, 55, cycles11, 3)).toBeNull();
    expect(computeHarmonicGroups(samples, fs, 54.99, { start: 0, spanSamples: (11 * fs) / 54.99, cycles: 11 }, 3)).not.toBeNull();
  });
});
