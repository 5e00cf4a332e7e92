import { describe, expect, it } from "vitest";
import { computeDeviationFactor } from "@/lib/analysis/deviation";
import { wholeCycleWindow } from "@/lib/analysis/cycles";
import { analyseCapture } from "@/lib/analysis";
import { captureOf, synthesise } from "./signals";

const DEVIATION_PP = 0.2; // percentage points, from the issue

function deviationOf(x: Float64Array, fs: number, f: number, basis: "average-cycle" | "worst-cycle" = "average-cycle"): number {
  const report = analyseCapture(captureOf([{ id: "V_AB", samples: x }], fs), { channelRoles: { V_AB: "vab" }, deviationBasis: basis });
  expect(report.deviationBasis).toBe(basis);
  return report.channels[0]!.deviationFactorPercent!;
}

describe("computeDeviationFactor", () => {
  it("computeDeviationFactor(pure sine) is 0 % (derived check value, DOMAIN §5)", () => {
    const x = synthesise([{ order: 1, amplitude: 325, phaseRad: 0.7 }], 50, 10000, 2001);
    expect(deviationOf(x, 10000, 50)).toBeLessThan(0.01);
  });

  it("computeDeviationFactor(square wave) is 1/√2 = 70.71 % (derived check value, DOMAIN §5)", () => {
    const fs = 100000;
    const f = 50.3;
    const x = Float64Array.from({ length: 12000 }, (_, n) => (Math.sin((2 * Math.PI * f * n) / fs + 0.1) >= 0 ? 1 : -1));
    expect(Math.abs(deviationOf(x, fs, f) - 70.71)).toBeLessThan(DEVIATION_PP);
  });

  it("computeDeviationFactor(sine + 5 % third harmonic) matches a brute-force phase search (closed form)", () => {
    const fs = 20000;
    const f = 50;
    const x = synthesise([{ order: 1, amplitude: 100 }, { order: 3, amplitude: 5, phaseRad: 0.4 }], f, fs, 4001);
    const rms = Math.sqrt((100 ** 2 + 5 ** 2) / 2);
    const peak = Math.SQRT2 * rms;
    let best = Number.POSITIVE_INFINITY;
    for (let k = 0; k < 36000; k++) {
      const phi = (2 * Math.PI * k) / 36000;
      let worst = 0;
      for (let n = 0; n < 400; n++) worst = Math.max(worst, Math.abs((x[n] as number) - peak * Math.sin((2 * Math.PI * f * n) / fs + phi)));
      best = Math.min(best, worst);
    }
    expect(Math.abs(deviationOf(x, fs, f, "worst-cycle") - (100 * best) / peak)).toBeLessThan(DEVIATION_PP);
  });

  it("computeDeviationFactor with zero AC content is null (explicit not-computable)", () => {
    const x = new Float64Array(1000).fill(3);
    const window = wholeCycleWindow(1000, 1000, 50)!;
    expect(computeDeviationFactor(x, 1000, 50, window, 3, 0, 0, "average-cycle")).toBeNull();
  });
});
