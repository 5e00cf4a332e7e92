import { describe, expect, it } from "vitest";
import { analyseCapture, ratingSchema, toleranceProfileSchema, tolerancePresets, type Rating } from "@/lib/analysis";
import { judge, overallStatus } from "@/lib/analysis/verdicts";
import { captureOf, synthesise } from "./signals";

describe("judge", () => {
  it("judge gives pass, marginal inside the guard, and fail outside the band (definition from the issue)", () => {
    expect(judge(4.0, null, 5, 0, 10)).toBe("pass");
    expect(judge(4.6, null, 5, 0, 10)).toBe("marginal");
    expect(judge(5.01, null, 5, 0, 10)).toBe("fail");
    expect(judge(380, 361, 399, 380, 10)).toBe("pass");
    expect(judge(362, 361, 399, 380, 10)).toBe("marginal");
    expect(judge(360, 361, 399, 380, 10)).toBe("fail");
    expect(judge(null, 0, 1, 0, 10)).toBe("not-applicable");
    expect(judge(3, null, null, 0, 10)).toBe("not-applicable");
  });

  it("overallStatus takes the worst status (definition from the issue)", () => {
    const v = (status: "pass" | "marginal" | "fail" | "not-applicable") => ({ check: "x", label: "x", measured: 1, unit: "", lower: null, upper: null, status, basis: "", source: "" });
    expect(overallStatus([v("pass"), v("marginal")])).toBe("marginal");
    expect(overallStatus([v("pass"), v("fail"), v("marginal")])).toBe("fail");
    expect(overallStatus([v("not-applicable")])).toBe("not-applicable");
    expect(overallStatus([v("pass"), v("not-applicable")])).toBe("pass");
  });
});

describe("tolerancePresets", () => {
  it("tolerancePresets each parse with toleranceProfileSchema and name a source (presets from DOMAIN sources)", () => {
    expect(tolerancePresets.length).toBeGreaterThanOrEqual(5);
    for (const preset of tolerancePresets) {
      expect(toleranceProfileSchema.parse(preset)).toEqual(preset);
      expect(preset.source).toMatch(/\[(S|M|CP)/);
    }
  });
});

describe("analyseCapture verdicts", () => {
  const rating: Rating = ratingSchema.parse({
    nominalVoltageV: 400,
    voltageBasis: "line-line-rms",
    frequencyHz: 50,
    phases: 3,
    connection: "star",
    poles: 4,
    ratedSpeedRpm: 1500,
    keLineRmsPerKrpm: 400 / 1.5,
    ratedKva: 500,
  });
  const fs = 20000;
  const make = (amplitude: number, shift: number, fifth: number) => synthesise([{ order: 1, amplitude }, { order: 5, amplitude: fifth }], 50, fs, 4001, shift);
  const run = (fifth: number, scale = 1) =>
    analyseCapture(
      captureOf([{ id: "vab", samples: make(400 * Math.SQRT2 * scale, 0, fifth) }, { id: "vbc", samples: make(400 * Math.SQRT2 * scale, (-2 * Math.PI) / 3, fifth) }, { id: "vca", samples: make(400 * Math.SQRT2 * scale, (2 * Math.PI) / 3, fifth) }], fs),
      { rating, tolerance: tolerancePresets.find((p) => p.id === "pm-back-emf-bench"), speedRpm: 1500 },
    );

  it("analyseCapture passes a clean rated set against the PM bench profile (common practice profile)", () => {
    const report = run(0);
    expect(report.overall).toBe("pass");
    const byCheck = Object.fromEntries(report.verdicts.map((v) => [v.check, v]));
    expect(byCheck["back-emf-constant"]!.status).toBe("pass");
    expect(byCheck["phase-sequence"]!.measured).toBe("positive");
    expect(byCheck["pole-count"]!.status).toBe("pass");
    expect(byCheck["tif"]!.status).toBe("not-applicable");
  });

  it("analyseCapture marks THD near the limit marginal and beyond it fail (profile THD ≤ 5 %, common practice)", () => {
    const thd = (report: ReturnType<typeof run>) => report.verdicts.find((v) => v.check === "thd")!;
    expect(thd(run(0.048 * 400 * Math.SQRT2)).status).toBe("marginal");
    expect(thd(run(0.06 * 400 * Math.SQRT2)).status).toBe("fail");
    expect(run(0.06 * 400 * Math.SQRT2).overall).toBe("fail");
  });

  it("analyseCapture fails the back-EMF constant 10 % low (profile Ke ±5 %, common practice)", () => {
    const verdict = run(0, 0.9).verdicts.find((v) => v.check === "back-emf-constant")!;
    expect(verdict.status).toBe("fail");
    expect(verdict.lower).toBeCloseTo((400 / 1.5) * 0.95, 9);
  });
});

describe("analyseCapture verdicts away from rated speed", () => {
  // 8 poles rated 3000 rpm (200 Hz), spun at 1000 rpm: f = p·n/120 = 66.667 Hz (DOMAIN §1, textbook).
  const rating: Rating = ratingSchema.parse({
    nominalVoltageV: 360, voltageBasis: "line-line-rms", frequencyHz: 200, phases: 3, connection: "star",
    poles: 8, ratedSpeedRpm: 3000, keLineRmsPerKrpm: 120,
  });
  // The PM bench preset with a ±5 % voltage band added, so both speed-scaled bands are in play.
  const profile = toleranceProfileSchema.parse({ ...tolerancePresets.find((p) => p.id === "pm-back-emf-bench"), voltageTolerancePercent: 5, frequencyTolerancePercent: 1 });
  const fs = 40000;
  const f = (8 * 1000) / 120;
  const line = (shift: number) => synthesise([{ order: 1, amplitude: 120 * Math.SQRT2 }], f, fs, 8001, shift);
  const report = analyseCapture(
    captureOf([{ id: "vab", samples: line(0) }, { id: "vbc", samples: line((-2 * Math.PI) / 3) }, { id: "vca", samples: line((2 * Math.PI) / 3) }], fs),
    { rating, tolerance: profile, speedRpm: 1000 },
  );
  const byCheck = Object.fromEntries(report.verdicts.map((v) => [v.check, v]));

  it("analyseCapture judges frequency against p·n/120 at the test speed, not the nameplate frequency (textbook)", () => {
    const frequency = byCheck["frequency"]!;
    expect(frequency.status).toBe("pass");
    expect(frequency.lower).toBeCloseTo(f * 0.99, 6);
    expect(frequency.upper).toBeCloseTo(f * 1.01, 6);
    expect(frequency.basis).toMatch(/1000 rpm/);
    expect(report.overall).toBe("pass");
  });

  it("analyseCapture scales the voltage band with speed (EMF ∝ n at constant excitation, Faraday's law)", () => {
    const voltage = byCheck["voltage"]!;
    expect(voltage.status).toBe("pass");
    expect(voltage.lower).toBeCloseTo(120 * 0.95, 6);
    expect(voltage.upper).toBeCloseTo(120 * 1.05, 6);
    expect(voltage.basis).toMatch(/scaled to the test speed/);
  });
});
