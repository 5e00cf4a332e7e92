import { describe, expect, it } from "vitest";
import { analyseCapture, judge, overallStatus, profileFromPreset, ratingSchema, toleranceProfileSchema, type Rating, type ToleranceProfile } from "@/lib/analysis";
import { captureOf, synthesise } from "./signals";

describe("judge", () => {
  const band = (lower: number | null, upper: number | null, nominal: number) => ({ lower, upper, nominal, marginalZonePercent: 10 });
  it("judge gives pass, marginal inside the zone, fail outside, and treats the edge as inside (definition, common practice)", () => {
    expect(judge(4.0, band(null, 5, 0))).toBe("pass");
    expect(judge(4.6, band(null, 5, 0))).toBe("marginal");
    expect(judge(5, band(null, 5, 0))).toBe("marginal");
    expect(judge(5.000001, band(null, 5, 0))).toBe("fail");
    expect(judge(380, band(361, 399, 380))).toBe("pass");
    expect(judge(362, band(361, 399, 380))).toBe("marginal");
    expect(judge(361, band(361, 399, 380))).toBe("marginal");
    expect(judge(360.999999, band(361, 399, 380))).toBe("fail");
  });

  it("judge makes a missing or non-finite figure inconclusive, never pass (nothing passes on missing evidence)", () => {
    expect(judge(null, band(0, 1, 0))).toBe("inconclusive");
    expect(judge(Number.NaN, band(0, 1, 0))).toBe("inconclusive");
    expect(judge(Number.POSITIVE_INFINITY, band(null, 1, 0))).toBe("inconclusive");
  });

  it("overallStatus orders pass < marginal < inconclusive < fail and ignores checks not required", () => {
    const v = (status: "pass" | "marginal" | "inconclusive" | "fail" | "not-required") => ({ status });
    expect(overallStatus([v("pass"), v("marginal")])).toBe("marginal");
    expect(overallStatus([v("pass"), v("inconclusive"), v("marginal")])).toBe("inconclusive");
    expect(overallStatus([v("inconclusive"), v("fail")])).toBe("fail");
    expect(overallStatus([v("pass"), v("not-required")])).toBe("pass");
    expect(overallStatus([v("not-required")])).toBe("inconclusive");
    expect(overallStatus([])).toBe("inconclusive");
  });
});

const pmRating: Rating = ratingSchema.parse({
  machineKind: "pm-generator", nominalVoltageV: 400, voltageBasis: "line-line-rms", frequencyHz: 50, phases: 3, connection: "star",
  poles: 4, ratedSpeedRpm: 1500, ke: { value: 400 / 1.5, basis: "line-line-rms-per-krpm" }, ratedKva: 500,
});

describe("profileFromPreset", () => {
  it("profileFromPreset gives every check a band or a reason, and parses (every preset)", () => {
    for (const id of ["lab-own", "iec-60034-1", "nema-mg-1", "iso-8528-5-g2", "ieee-519-2014", "genset-acceptance"] as const) {
      const profile = profileFromPreset(id, pmRating);
      expect(toleranceProfileSchema.parse(profile)).toEqual(profile);
      for (const rule of Object.values(profile.checks)) expect(rule.required ? rule.source.document.length : rule.reason.length).toBeGreaterThan(2);
    }
  });

  it("profileFromPreset derives THF 5 % for 300–1000 kVA and none below 300 kVA (IEC 60034-1 classes, from memory)", () => {
    const thf = profileFromPreset("iec-60034-1", pmRating).checks.thf;
    expect(thf.required && thf.maxPercent).toBe(5);
    const small = profileFromPreset("iec-60034-1", { ...pmRating, ratedKva: 45 }).checks.thf;
    expect(small.required).toBe(false);
  });

  it("profileFromPreset rules out TIF away from 60 Hz and Ke on a wound-field machine (definitions)", () => {
    const profile = profileFromPreset("lab-own", { ...pmRating, machineKind: "wound-field-alternator", ke: undefined });
    expect(profile.checks.tif.required).toBe(false);
    expect(profile.checks["back-emf-constant"].required).toBe(false);
  });
});

describe("analyseCapture verdicts", () => {
  const profile: ToleranceProfile = profileFromPreset("lab-own", pmRating);
  const fs = 20000;
  const make = (amplitude: number, shift: number, fifth: number) => synthesise([{ order: 1, amplitude }, { order: 5, amplitude: fifth }], 50, fs, 4001, shift);
  const run = (fifth: number, scale = 1) =>
    analyseCapture(
      captureOf([{ id: "vab", samples: make(400 * Math.SQRT2 * scale, 0, fifth) }, { id: "vbc", samples: make(400 * Math.SQRT2 * scale, (-2 * Math.PI) / 3, fifth) }, { id: "vca", samples: make(400 * Math.SQRT2 * scale, (2 * Math.PI) / 3, fifth) }], fs),
      { rating: pmRating, profile, speedRpm: 1500 },
    );

  it("analyseCapture passes a clean rated set against the lab's own profile (common practice profile)", () => {
    const report = run(0);
    const byCheck = Object.fromEntries(report.verdicts.map((v) => [v.check, v]));
    expect(byCheck["back-emf-constant"]!.status).toBe("pass");
    expect(byCheck["phase-sequence"]!.measured).toBe("positive");
    expect(byCheck["pole-count"]!.status).toBe("pass");
    expect(byCheck["tif"]!.status).toBe("not-required");
    expect(report.overall).toBe("pass");
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

  it("analyseCapture marks the checks outside the plan step not required, with the step named", () => {
    const report = analyseCapture(
      captureOf([{ id: "vab", samples: make(400 * Math.SQRT2, 0, 0) }, { id: "vbc", samples: make(400 * Math.SQRT2, (-2 * Math.PI) / 3, 0) }, { id: "vca", samples: make(400 * Math.SQRT2, (2 * Math.PI) / 3, 0) }], fs),
      { rating: pmRating, profile, speedRpm: 1500, checks: ["voltage"], stepName: "Open circuit" },
    );
    const thd = report.verdicts.find((v) => v.check === "thd")!;
    expect(thd.status).toBe("not-required");
    expect(thd.reason).toMatch(/Open circuit/);
    expect(report.verdicts.filter((v) => v.status !== "not-required").map((v) => v.check)).toEqual(["voltage"]);
  });
});

describe("analyseCapture verdicts away from rated speed", () => {
  // 8 poles rated 3000 rpm (200 Hz), spun at 1000 rpm: f = p·n/120 = 66.667 Hz (DOMAIN §1, textbook).
  const rating: Rating = ratingSchema.parse({
    machineKind: "pm-generator", nominalVoltageV: 360, voltageBasis: "line-line-rms", frequencyHz: 200, phases: 3, connection: "star",
    poles: 8, ratedSpeedRpm: 3000, ke: { value: 120, basis: "line-line-rms-per-krpm" },
  });
  const profile = profileFromPreset("lab-own", rating);
  const fs = 40000;
  const f = (8 * 1000) / 120;
  const line = (shift: number) => synthesise([{ order: 1, amplitude: 120 * Math.SQRT2 }], f, fs, 8001, shift);
  const report = analyseCapture(
    captureOf([{ id: "vab", samples: line(0) }, { id: "vbc", samples: line((-2 * Math.PI) / 3) }, { id: "vca", samples: line((2 * Math.PI) / 3) }], fs),
    { rating, profile, speedRpm: 1000 },
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
