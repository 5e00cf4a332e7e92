import { describe, expect, it } from "vitest";
import { computeDeviationFactor } from "@/lib/analysis/deviation";
import { PINS, rel } from "./steps";

// 200 samples a cycle at 10 kS/s, 50 Hz. A = 1, so E0 = √2·E_rms is passed as acRms = 1/√2.
const fs = 10000;
const N = 200;
const sine = (n: number) => Math.sin((2 * Math.PI * n) / N);
const third = (n: number) => 0.05 * Math.sin((6 * Math.PI * n) / N);
const window = (cycles: number) => ({ start: 0, spanSamples: cycles * N, cycles });
// sin(ωt) = cos(ωt − π/2): the fundamental's phase in the engine's cos convention.
const PHASE = -Math.PI / 2;

describe("computeDeviationFactor (pins)", () => {
  it("computeDeviationFactor of a pure sine is 0 even when the phase it starts from is 0.3° off the grid (closed form)", () => {
    const samples = Float64Array.from({ length: 3 * N }, (_, n) => sine(n));
    const off = PHASE + (0.3 * Math.PI) / 180;
    expect(computeDeviationFactor(samples, fs, 50, window(3), 0, 1 / Math.SQRT2, off, "average-cycle")!).toBeLessThan(1e-7);
  });

  it("computeDeviationFactor of sin + 0.05·sin 3ωt in one of two cycles: worst = 100·ΔE/E0, average = half of it (scipy script)", () => {
    const samples = Float64Array.from({ length: 2 * N }, (_, n) => sine(n) + (n >= N ? third(n) : 0));
    const worst = computeDeviationFactor(samples, fs, 50, window(2), 0, 1 / Math.SQRT2, PHASE, "worst-cycle")!;
    const average = computeDeviationFactor(samples, fs, 50, window(2), 0, 1 / Math.SQRT2, PHASE, "average-cycle")!;
    expect(rel(worst, 100 * PINS.deviationThirdHarmonicCycle!)).toBeLessThan(1e-6);
    expect(rel(average, (100 * PINS.deviationThirdHarmonicCycle!) / 2)).toBeLessThan(1e-6);
  });
});
