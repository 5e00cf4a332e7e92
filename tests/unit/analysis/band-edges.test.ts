import { describe, expect, it } from "vitest";
import { judgeReport, overallStatus, VERDICT_ORDER, type AnalysisReport, type VerdictStatus } from "@/lib/analysis";
import { cleanReport, pmProfile, pmRating, withFigure } from "./judged-report";

// Every band of the lab's own profile for a 400 V / 50 Hz / 4-pole / 500 kVA rating, judged exactly
// at its edge and one relative step (1e-9) either side; the marginal zone is 10 % of the distance
// from nominal to the edge. Expected edges come from the profile (lib/analysis/tolerance-presets.ts,
// "lab-own", common practice) and the nameplate, worked by hand.

const STEP = 1e-9;
const base = cleanReport();
const statusOf = (report: AnalysisReport, check: string): VerdictStatus =>
  judgeReport(report, { rating: pmRating, profile: pmProfile }).verdicts.find((v) => v.check === check)!.status;
const at = (check: string, value: number | string | null) => statusOf(withFigure(base, check, value), check);

/** [check, nominal, lower edge or null, upper edge or null, source of the numbers]. */
const BANDS: [string, number, number | null, number | null, string][] = [
  ["voltage", 400, 380, 420, "±5 % of 400 V rated (profile)"],
  ["frequency", 50, 49.5, 50.5, "±1 % of 50 Hz rated (profile)"],
  ["thd", 0, null, 5, "THD ≤ 5 % (profile)"],
  ["individual-harmonic", 0, null, 3, "single harmonic ≤ 3 % (profile)"],
  ["voltage-unbalance", 0, null, 1, "VUF ≤ 1 % (profile)"],
  ["phase-displacement", 120, 118, 122, "120° ± 2° (profile)"],
  ["deviation-factor", 0, null, 10, "deviation factor ≤ 10 % (NEMA MG 1 limit in the profile)"],
  ["thf", 0, null, 5, "THF ≤ 5 % for 300–1000 kVA (IEC 60034-1 class, from memory)"],
  ["tif", 0, null, 50, "TIF ≤ 50 (profile as set in the test)"],
  ["back-emf-constant", 400 / 1.5, (400 / 1.5) * 0.95, (400 / 1.5) * 1.05, "±5 % of 266.67 V/krpm nominal (profile)"],
  ["pole-count", 4, 3.92, 4.08, "±2 % of 4 poles (profile)"],
];

describe("judgeReport band edges", () => {
  it("judgeReport passes the clean rated capture on every check (closed form: rated sine set)", () => {
    const judged = judgeReport(base, { rating: pmRating, profile: pmProfile });
    expect(judged.verdicts.filter((v) => v.status !== "pass").map((v) => `${v.check}:${v.status}`)).toEqual([]);
    expect(judged.overall).toBe("pass");
  });

  for (const [check, nominal, lower, upper, source] of BANDS) {
    it(`judgeReport reports the ${check} band edges (${source})`, () => {
      const verdict = judgeReport(base, { rating: pmRating, profile: pmProfile }).verdicts.find((v) => v.check === check)!;
      if (lower === null) expect(verdict.lower).toBeNull();
      else expect(verdict.lower!).toBeCloseTo(lower, 10);
      expect(verdict.upper!).toBeCloseTo(upper!, 10);
    });

    it(`judgeReport judges ${check} at its upper edge and one step either side (${source})`, () => {
      const verdict = judgeReport(base, { rating: pmRating, profile: pmProfile }).verdicts.find((v) => v.check === check)!;
      const edge = verdict.upper as number;
      expect(at(check, edge)).toBe("marginal");
      expect(at(check, edge * (1 + STEP))).toBe("fail");
      expect(at(check, edge * (1 - STEP))).toBe("marginal");
      const zoneStart = edge - 0.1 * (edge - nominal);
      expect(at(check, zoneStart * (1 + STEP))).toBe("marginal");
      expect(at(check, zoneStart * (1 - STEP))).toBe("pass");
    });

    if (lower !== null) {
      it(`judgeReport judges ${check} at its lower edge and one step either side (${source})`, () => {
        const verdict = judgeReport(base, { rating: pmRating, profile: pmProfile }).verdicts.find((v) => v.check === check)!;
        const edge = verdict.lower as number;
        expect(at(check, edge)).toBe("marginal");
        expect(at(check, edge * (1 - STEP))).toBe("fail");
        expect(at(check, edge * (1 + STEP))).toBe("marginal");
        const zoneEnd = edge + 0.1 * (nominal - edge);
        expect(at(check, zoneEnd * (1 - STEP))).toBe("marginal");
        expect(at(check, zoneEnd * (1 + STEP))).toBe("pass");
      });
    }
  }

  it("judgeReport judges a single harmonic exactly at 3 % of the fundamental marginal, not fail (limits inclusive, profile)", () => {
    expect(at("individual-harmonic", 3)).toBe("marginal");
    expect(at("individual-harmonic", 3.000001)).toBe("fail");
  });

  it("judgeReport judges the phase sequence: expected passes, the other fails, none is inconclusive (profile: positive)", () => {
    expect(at("phase-sequence", "positive")).toBe("pass");
    expect(at("phase-sequence", "negative")).toBe("fail");
    const noSet = judgeReport({ ...base, threePhase: null }, { rating: pmRating, profile: pmProfile });
    expect(noSet.verdicts.find((v) => v.check === "phase-sequence")!.status).toBe("inconclusive");
  });

  it("judgeReport makes a missing figure inconclusive with a reason, never pass (nothing passes on missing evidence)", () => {
    for (const check of ["thd", "thf", "tif", "deviation-factor"]) {
      const verdict = judgeReport(withFigure(base, check, null), { rating: pmRating, profile: pmProfile }).verdicts.find((v) => v.check === check)!;
      expect(verdict.status).toBe("inconclusive");
      expect(verdict.reason).toMatch(/could not be computed/);
    }
  });
});

describe("overallStatus order", () => {
  it("overallStatus takes the worse of every pair in the order pass < marginal < inconclusive < fail (documented order)", () => {
    expect(VERDICT_ORDER).toEqual(["pass", "marginal", "inconclusive", "fail"]);
    for (const [i, a] of VERDICT_ORDER.entries()) {
      for (const [j, b] of VERDICT_ORDER.entries()) {
        expect(overallStatus([{ status: a }, { status: b }, { status: "not-required" }])).toBe(VERDICT_ORDER[Math.max(i, j)]);
      }
    }
  });

  it("judgeReport's overall is the worst check: one failing figure fails a passing capture (definition)", () => {
    expect(judgeReport(withFigure(base, "thd", 6), { rating: pmRating, profile: pmProfile }).overall).toBe("fail");
    expect(judgeReport(withFigure(base, "thd", null), { rating: pmRating, profile: pmProfile }).overall).toBe("inconclusive");
    expect(judgeReport(withFigure(base, "thd", 4.8), { rating: pmRating, profile: pmProfile }).overall).toBe("marginal");
  });
});
