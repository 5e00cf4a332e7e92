import { describe, expect, it } from "vitest";
import { analyseCapture, createCaptureParser, profileFromPreset, type Rating } from "@/lib/analysis";
import { figureRowsOf, HARMONIC_FIGURE, MAX_TREND_HARMONIC } from "@/lib/trends/figure-rows";
import { makeThreePhaseCsv } from "@/tests/fixtures/pipeline/make-capture";

const nameplate: Rating = { machineKind: "wound-field-alternator", nominalVoltageV: 400, voltageBasis: "line-line-rms", frequencyHz: 50, phases: 3, connection: "star", poles: 4, ratedSpeedRpm: 1500, ratedKva: 45 };
const profile = profileFromPreset("lab-own", nameplate);

function reportOf(csv: string) {
  const parser = createCaptureParser();
  parser.push(new TextEncoder().encode(csv));
  return analyseCapture(parser.finish(), { speedRpm: 1500, poles: 4, rating: nameplate, profile, harmonics: 50 });
}

describe("figureRowsOf", () => {
  it("figureRowsOf: one row per numeric check and per harmonic order, the phase sequence left out", () => {
    const report = reportOf(makeThreePhaseCsv({ fifth: 0.02 }));
    const rows = figureRowsOf(report);
    const checks = rows.filter((r) => r.harmonicOrder === 0).map((r) => r.figure);
    expect(checks).toEqual(report.verdicts.filter((v) => typeof v.measured !== "string").map((v) => v.check));
    expect(checks).not.toContain("phase-sequence");
    const voltage = rows.find((r) => r.figure === "voltage");
    expect(voltage).toMatchObject({ value: report.verdicts.find((v) => v.check === "voltage")?.measured, flagged: false });
    const orders = rows.filter((r) => r.figure === HARMONIC_FIGURE).map((r) => r.harmonicOrder);
    expect(orders[0]).toBe(2);
    expect(Math.max(...orders)).toBeLessThanOrEqual(MAX_TREND_HARMONIC);
    // The fifth is written at 2 % of the fundamental (tests/fixtures/pipeline/make-capture.ts).
    expect(rows.find((r) => r.figure === HARMONIC_FIGURE && r.harmonicOrder === 5)?.value).toBeCloseTo(2, 2);
  });

  it("figureRowsOf: a capture 100 times too small (plausibility alert) flags every row", () => {
    const rows = figureRowsOf(reportOf(makeThreePhaseCsv({ phaseRmsV: 2.3094 })));
    expect(rows.length).toBeGreaterThan(0);
    expect(rows.every((r) => r.flagged)).toBe(true);
  });

  it("figureRowsOf: a figure that could not be computed is flagged with no value", () => {
    const report = reportOf(makeThreePhaseCsv());
    const broken = { ...report, verdicts: report.verdicts.map((v) => (v.check === "thd" ? { ...v, measured: null, status: "inconclusive" as const } : v)) };
    expect(figureRowsOf(broken).find((r) => r.figure === "thd")).toMatchObject({ value: null, flagged: true, status: "inconclusive" });
  });
});
