import { describe, expect, it } from "vitest";
import { judge, overallStatus } from "@/lib/analysis/verdicts";
import { judgeGuarded } from "@/lib/analysis/decision-rule";
import { figures } from "@/lib/analysis/figures";
import { profileFromPreset } from "@/lib/analysis/tolerance-presets";
import { ratingSchema } from "@/lib/analysis/rating";
import { cleanReport, pmProfile, pmRating } from "../analysis/judged-report";
import { nextDown, nextUp } from "./steps";

// docs/analysis-report.md: limits are inclusive (a value at a limit is inside, "marginal"); the
// marginal zone is the last `marginalZonePercent` of the distance from nominal to a limit, its start
// itself passing. Band 90..110 about 100 with a 10 % zone: zone starts at 91 and 109 (by hand).
const band = { lower: 90, upper: 110, nominal: 100, marginalZonePercent: 10 };

describe("judge at every edge (pins)", () => {
  it.each([
    [nextDown(90), "fail"], [90, "marginal"], [nextUp(90), "marginal"],
    [nextDown(91), "marginal"], [91, "pass"], [nextUp(91), "pass"],
    [nextDown(109), "pass"], [109, "pass"], [nextUp(109), "marginal"],
    [nextDown(110), "marginal"], [110, "marginal"], [nextUp(110), "fail"],
  ])("judge(%d, 90..110 about 100, zone 10 %%) is %s", (value, status) => {
    expect(judge(value, band)).toBe(status);
  });
});

describe("judgeGuarded at every edge (pins)", () => {
  // Guarded acceptance with w = U = 2 (ILAC-G8:09/2019): acceptance limits 92 and 108, themselves accepted.
  it.each([
    [nextDown(90), "fail"], [90, "marginal"], [nextDown(92), "marginal"], [92, "pass"],
    [108, "pass"], [nextUp(108), "marginal"], [110, "marginal"], [nextUp(110), "fail"],
  ])("judgeGuarded(%d, 90..110, U = 2) is %s", (value, status) => {
    expect(judgeGuarded(value as number, band, 2).status).toBe(status);
  });
});

describe("figures (pins)", () => {
  const clean = cleanReport();
  const withSpeed = (speedRpm: number) => ({ ...clean, backEmf: { ...clean.backEmf!, speedRpm } });

  it("figures scales the nameplate voltage to the test speed only beyond 1 % off rated (1515.1 rpm scaled, 1514.9 rpm not)", () => {
    expect(figures(withSpeed(1515.1), pmRating, pmProfile).voltage.nominal).toBeCloseTo((400 * 1515.1) / 1500, 9);
    expect(figures(withSpeed(1514.9), pmRating, pmProfile).voltage.nominal).toBe(400);
  });

  it("figures takes the unbalance the profile names: NEMA, IEEE or VUF", () => {
    const measured = { ...clean, threePhase: { ...clean.threePhase!, unbalance: { nemaPercent: 1.1, ieeePercent: 2.2, vufPercent: 3.3 } } };
    const value = (definition: "nema" | "ieee" | "vuf") =>
      figures(measured, pmRating, { ...pmProfile, checks: { ...pmProfile.checks, "voltage-unbalance": { required: true, source: { document: "x", clause: "", verified: false }, maxPercent: 1, definition } } })["voltage-unbalance"].value;
    expect([value("nema"), value("ieee"), value("vuf")]).toEqual([1.1, 2.2, 3.3]);
  });

  it("figures averages only line-neutral (or single) channels for a line-neutral rating, never a line-line one", () => {
    const rating = ratingSchema.parse({ ...pmRating, voltageBasis: "line-neutral-rms", nominalVoltageV: 230 });
    const channels = [...clean.channels, { ...clean.channels[0]!, id: "van", role: "van" as const, rms: 230 }];
    expect(channels.map((c) => c.role)).toEqual(["vab", "vbc", "vca", "van"]);
    expect(figures({ ...clean, channels }, rating, profileFromPreset("lab-own", rating)).voltage.value).toBe(230);
  });

  it("figures judges a two-phase machine's displacement about 90° (±2° lab profile) and three-phase about 120°", () => {
    const two = ratingSchema.parse({ ...pmRating, phases: 2 });
    const twoBand = figures(clean, two, profileFromPreset("lab-own", two))["phase-displacement"].band!;
    expect([twoBand.lower, twoBand.nominal, twoBand.upper]).toEqual([88, 90, 92]);
    const threeBand = figures(clean, pmRating, pmProfile)["phase-displacement"].band!;
    expect([threeBand.lower, threeBand.nominal, threeBand.upper]).toEqual([118, 120, 122]);
  });
});

describe("worst channel and overall status (pins)", () => {
  it("figures judges the worst voltage channel: THD 1, 2 and 3 % read 3 %", () => {
    const clean = cleanReport();
    const channels = clean.channels.map((c, i) => ({ ...c, thdFPercent: i + 1 }));
    expect(figures({ ...clean, channels }, pmRating, pmProfile).thd.value).toBe(3);
  });

  it("overallStatus of nothing judged is inconclusive, and the worst of pass, marginal, inconclusive, fail otherwise", () => {
    expect(overallStatus([])).toBe("inconclusive");
    expect(overallStatus([{ status: "pass" }, { status: "marginal" }])).toBe("marginal");
    expect(overallStatus([{ status: "marginal" }, { status: "inconclusive" }])).toBe("inconclusive");
    expect(overallStatus([{ status: "fail" }, { status: "inconclusive" }])).toBe("fail");
  });
});
