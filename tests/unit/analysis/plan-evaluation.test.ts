import { readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { evaluatePlan, fitBackEmfConstant, type CaptureResult, type VerdictStatus } from "@/lib/analysis";
import { pmProfile, pmRating } from "./judged-report";

type Fixture = { cases: { name: string; points: { speedRpm: number; volts: number; kePerKrpm: number }[]; keVPerKrpm: number; linearityPercent: number }[] };
const fixture = JSON.parse(readFileSync(path.join(__dirname, "../../fixtures/analysis/ke-fit.json"), "utf8")) as Fixture;

describe("fitBackEmfConstant", () => {
  for (const c of fixture.cases) {
    it(`fitBackEmfConstant matches numpy lstsq through the origin and its linearity: ${c.name} (numpy, scripts/fixtures/make_ke_fit_fixture.py)`, () => {
      const fit = fitBackEmfConstant(c.points.map((p) => ({ speedRpm: p.speedRpm, ke: p.kePerKrpm })))!;
      expect(Math.abs(fit.ke - c.keVPerKrpm) / c.keVPerKrpm).toBeLessThan(1e-12);
      expect(Math.abs(fit.linearityPercent - c.linearityPercent)).toBeLessThan(1e-9);
    });
  }

  it("fitBackEmfConstant gives nothing without a usable point (no evidence, no constant)", () => {
    expect(fitBackEmfConstant([])).toBeNull();
    expect(fitBackEmfConstant([{ speedRpm: 0, ke: 100 }])).toBeNull();
  });
});

const nominal = 400 / 1.5;
const steps = [
  { id: "nl", testKind: "no-load" },
  { id: "b1", testKind: "back-emf" },
  { id: "b2", testKind: "back-emf" },
  { id: "b3", testKind: "back-emf" },
];
let serial = 0;
const result = (step: string, overall: VerdictStatus | null, minute: number, speedRpm: number | null = null, ke: number | null = null): CaptureResult => ({
  captureId: `c${++serial}`, createdAt: new Date(Date.UTC(2026, 0, 5, 9, minute)), speedRpm, judgedForStepId: step, overall, ke,
});
const passingSet = () => [
  result("nl", "pass", 1, 1500),
  result("b1", "pass", 2, 500, nominal),
  result("b2", "marginal", 3, 1000, nominal * 1.01),
  result("b3", "pass", 4, 1500, nominal * 0.99),
];
const evaluate = (results: CaptureResult[], chosen = new Map<string, string>()) => evaluatePlan({ steps, results, chosen, rating: pmRating, profile: pmProfile });
const statusOf = (e: ReturnType<typeof evaluate>, id: string) => e.steps.find((s) => s.stepId === id)!;

describe("evaluatePlan", () => {
  it("evaluatePlan is complete and within only when every step passed (marginal counts as passed) and the Ke fit passes (plan rule)", () => {
    const e = evaluate(passingSet());
    expect(e.steps.map((s) => s.status)).toEqual(["passed", "passed", "passed", "passed"]);
    expect(e.keFit!.status).toBe("pass");
    expect(e.state).toBe("complete-within");
  });

  it("evaluatePlan takes the latest capture judged for a step as its record unless a quality engineer chose one (capture-of-record rule)", () => {
    const older = result("nl", "pass", 10, 1500);
    const newer = result("nl", "fail", 20, 1500);
    const others = passingSet().filter((r) => r.judgedForStepId !== "nl");
    const latest = evaluate([older, newer, ...others]);
    expect(statusOf(latest, "nl").record!.captureId).toBe(newer.captureId);
    expect(statusOf(latest, "nl").status).toBe("failed");
    expect(latest.state).toBe("failed");
    const picked = evaluate([older, newer, ...others], new Map([["nl", older.captureId]]));
    expect(statusOf(picked, "nl").record!.captureId).toBe(older.captureId);
    expect(statusOf(picked, "nl").chosen).toBe(true);
    expect(picked.state).toBe("complete-within");
  });

  it("evaluatePlan ignores captures judged for another step and marks a step without one missing (plan rule)", () => {
    const results = passingSet().filter((r) => r.judgedForStepId !== "nl");
    results.push({ ...result("b1", "pass", 30, 1500), judgedForStepId: "other" });
    const e = evaluate(results);
    expect(statusOf(e, "nl").status).toBe("missing");
    expect(statusOf(e, "nl").record).toBeNull();
    expect(e.state).toBe("incomplete");
  });

  it("evaluatePlan marks a step inconclusive when its record is inconclusive or unjudged, and the plan with it (nothing passes on missing evidence)", () => {
    for (const overall of ["inconclusive", null] as const) {
      const results = passingSet().map((r) => (r.judgedForStepId === "b2" ? { ...r, overall } : r));
      const e = evaluate(results);
      expect(statusOf(e, "b2").status).toBe("inconclusive");
      expect(e.state).toBe("inconclusive");
    }
  });

  it("evaluatePlan fails a unit whose captures pass one by one but whose Ke fit falls outside ±5 % (profile, DOMAIN §11)", () => {
    const results = passingSet().map((r) => (r.ke !== null ? { ...r, ke: nominal * 1.06 } : r));
    const e = evaluate(results);
    expect(e.keFit!.ke!).toBeCloseTo(nominal * 1.06, 9);
    expect(e.keFit!.upper!).toBeCloseTo(nominal * 1.05, 9);
    expect(e.keFit!.status).toBe("fail");
    expect(e.state).toBe("failed");
  });

  it("evaluatePlan fits Ke by least squares through the origin over the back-EMF records (numpy fixture, first case)", () => {
    const c = fixture.cases[0]!;
    const results = c.points.slice(0, 3).map((p, i) => result(["b1", "b2", "b3"][i]!, "pass", 40 + i, p.speedRpm, p.kePerKrpm));
    const e = evaluate([result("nl", "pass", 39, 1500), ...results]);
    const expected = fitBackEmfConstant(c.points.slice(0, 3).map((p) => ({ speedRpm: p.speedRpm, ke: p.kePerKrpm })))!;
    expect(e.keFit!.ke).toBe(expected.ke);
    expect(e.keFit!.points).toHaveLength(3);
  });
});
