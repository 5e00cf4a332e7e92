import { describe, expect, it } from "vitest";
import { wholeCycleWindow } from "@/lib/analysis/cycles";
import { countFlatTops, scanWindow } from "@/lib/analysis/channel-scan";
import { rel } from "./steps";

// 2·cos(2π·50t) + 0.5 at 1 kS/s: 20 samples a cycle. Over whole cycles the mean of cos² at equally
// spaced points is exactly ½, so mean = 0.5 and mean square = 0.5² + 2²/2 = 2.25 (closed form).
const wave = (count: number) => Float64Array.from({ length: count }, (_, n) => 0.5 + 2 * Math.cos((2 * Math.PI * n) / 20));

describe("wholeCycleWindow (pins)", () => {
  it("wholeCycleWindow(1000, 1000 S/s, 50 Hz) takes all 50 cycles of 20 samples (closed form)", () => {
    expect(wholeCycleWindow(1000, 1000, 50)).toEqual({ start: 0, spanSamples: 1000, cycles: 50 });
  });

  it("wholeCycleWindow gives one cycle for a record of exactly one cycle, none for one sample less (edge)", () => {
    expect(wholeCycleWindow(20, 1000, 50)).toEqual({ start: 0, spanSamples: 20, cycles: 1 });
    expect(wholeCycleWindow(19, 1000, 50)).toBeNull();
  });
});

describe("scanWindow (pins)", () => {
  it("scanWindow(2·cos + 0.5 over 5 whole cycles) gives mean 0.5, mean square 2.25, peak 2.5 (closed form)", () => {
    const scan = scanWindow(wave(100), { start: 0, spanSamples: 100, cycles: 5 });
    expect(Math.abs(scan.mean - 0.5)).toBeLessThan(1e-12);
    expect(rel(scan.meanSquare, 2.25)).toBeLessThan(1e-12);
    expect(scan.peak).toBe(2.5);
  });

  it("scanWindow over whole cycles inside a longer record uses the trapezoid weights (same closed form)", () => {
    const scan = scanWindow(wave(130), { start: 0, spanSamples: 100, cycles: 5 });
    expect(Math.abs(scan.mean - 0.5)).toBeLessThan(1e-12);
    expect(rel(scan.meanSquare, 2.25)).toBeLessThan(1e-12);
  });
});

describe("countFlatTops (pins)", () => {
  it("countFlatTops counts runs of exactly the run length at the extremes, not one shorter (edge)", () => {
    const top = [0, 5, 5, 5, 5, 0, -5, -5, -5, -5, 0, 5, 5, 5, 0];
    const samples = Float64Array.from(top);
    expect(countFlatTops(samples, 0, samples.length, 4)).toEqual({ runs: 2, longestRun: 4 });
    expect(countFlatTops(samples, 0, samples.length, 3)).toEqual({ runs: 3, longestRun: 4 });
  });
});

describe("analyseChannel figures (pins)", () => {
  it("analyseChannel of 2·cos + 0.5 gives RMS 1.5, crest factor 2.5/1.5 and, with DC removed, a deviation factor of 0 (closed form)", async () => {
    const { analyseChannel } = await import("@/lib/analysis/channel-metrics");
    const window = { start: 0, spanSamples: 100, cycles: 5 };
    const context = { sampleRateHz: 1000, frequencyHz: 50, window, harmonicWindow: window, maxOrder: 9, groupingIec: false, deviationBasis: "average-cycle" as const };
    const { report } = analyseChannel({ id: "v", unit: "V", samples: wave(100) }, "v", context);
    expect(rel(report.rms, 1.5)).toBeLessThan(1e-12);
    expect(rel(report.crestFactor!, 2.5 / 1.5)).toBeLessThan(1e-12);
    expect(report.deviationFactorPercent!).toBeLessThan(1e-6);
  });
});
