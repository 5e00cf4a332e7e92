import { describe, expect, it } from "vitest";
import { describeDecisionRule, judgeGuarded, judgeReport, toleranceProfileSchema, type Band } from "@/lib/analysis";
import { cleanReport, pmProfile, pmRating, withFigure } from "./judged-report";

// Guarded acceptance with w = U (ILAC-G8:09/2019 §4.2.2): acceptance limits lower + U and upper − U.
// Band 380–420 V (±5 % of 400 V, the lab's own profile) with U = 2 V: pass on [382, 418], marginal on
// [380, 382) and (418, 420], fail outside [380, 420]. Edges worked by hand; STEP is one relative 1e-9.
const band: Band = { lower: 380, upper: 420, nominal: 400, marginalZonePercent: 10 };
const STEP = 1e-7;

describe("judgeGuarded", () => {
  it.each([
    [418, "pass"], [418 + STEP, "marginal"], [420, "marginal"], [420 + STEP, "fail"],
    [382, "pass"], [382 - STEP, "marginal"], [380, "marginal"], [380 - STEP, "fail"], [400, "pass"],
  ])("judgeGuarded judges %s V against 380–420 V with U = 2 V as %s (hand)", (value, status) => {
    expect(judgeGuarded(value, band, 2).status).toBe(status);
  });

  it("judgeGuarded with U = 0 is simple acceptance without a marginal zone (hand)", () => {
    expect([judgeGuarded(420, band, 0).status, judgeGuarded(420 + STEP, band, 0).status]).toEqual(["pass", "fail"]);
  });

  it("judgeGuarded marks every in-band value marginal when U exceeds half the band (hand: U = 25 V > 20 V)", () => {
    expect(judgeGuarded(400, band, 25).status).toBe("marginal");
  });

  it("judgeGuarded is inconclusive inside the band without an uncertainty, and fails outside", () => {
    expect(judgeGuarded(400, band, null).status).toBe("inconclusive");
    expect(judgeGuarded(421, band, null).status).toBe("fail");
  });

  it("judgeGuarded on a one-sided limit (THD-like ≤ 5) uses upper − U only (hand)", () => {
    const upTo: Band = { lower: null, upper: 5, nominal: 0, marginalZonePercent: 10 };
    expect([judgeGuarded(4.5, upTo, 0.5).status, judgeGuarded(4.5 + STEP, upTo, 0.5).status, judgeGuarded(0, upTo, 0.5).status]).toEqual(["pass", "marginal", "pass"]);
  });
});

describe("judgeReport with a decision rule", () => {
  const instruments = [{ assetTag: "VP-9", kind: "voltage-probe" as const, channel: "", spec: { gainPercentOfReading: 0.5 * Math.sqrt(3) } }];
  // Probe ±(0.5·√3) % of reading: u = 0.5 % of the reading, U = 1 % of it (hand). At 417 V, U = 4.17 V and
  // the upper acceptance limit is 420 − 4.17 = 415.83 V < 417 → marginal; at 410 V, 420 − 4.10 = 415.9 > 410 → pass.
  const guarded = toleranceProfileSchema.parse({ ...pmProfile, decisionRule: "guarded" });
  const base = cleanReport();
  const voltageAt = (value: number, profile = guarded) =>
    judgeReport(withFigure(base, "voltage", value), { rating: pmRating, profile, instruments }).verdicts.find((v) => v.check === "voltage")!;

  it("judgeReport under guarded acceptance makes 417 V marginal (417 > 420 − 4.17) and 410 V a pass (410 < 420 − 4.1) (hand)", () => {
    expect(voltageAt(417)).toMatchObject({ status: "marginal" });
    expect(voltageAt(417).expandedUncertainty).toBeCloseTo(4.17, 9);
    expect(voltageAt(410).status).toBe("pass");
  });

  it("judgeReport under simple acceptance keeps the marginal zone (10 % of 20 V: 418–420 V) and ignores U for the verdict (profile)", () => {
    expect(voltageAt(417, pmProfile).status).toBe("pass");
    expect(voltageAt(419, pmProfile).status).toBe("marginal");
  });

  it("judgeReport under guarded acceptance without instruments is inconclusive on voltage, never pass", () => {
    const v = judgeReport(withFigure(base, "voltage", 400), { rating: pmRating, profile: guarded }).verdicts.find((x) => x.check === "voltage")!;
    expect(v.status).toBe("inconclusive");
    expect(v.expandedUncertainty).toBeNull();
  });

  it("toleranceProfileSchema reads a stored profile without a rule as simple acceptance", () => {
    const { decisionRule: _omit, ...stored } = pmProfile;
    void _omit;
    expect(toleranceProfileSchema.parse(stored).decisionRule).toBe("simple");
  });

  it("describeDecisionRule words both rules with the guard band", () => {
    expect(describeDecisionRule("guarded")).toMatch(/guard band w = U/);
    expect(describeDecisionRule("simple")).toMatch(/Simple acceptance/);
  });
});
