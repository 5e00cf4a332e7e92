import { describe, expect, it } from "vitest";
import { fitBackEmfConstant } from "@/lib/analysis/plan-evaluation";
import { ratingSchema } from "@/lib/analysis/rating";
import { nextDown, nextUp, rel } from "./steps";

describe("fitBackEmfConstant (pins)", () => {
  it("fitBackEmfConstant through (1000 rpm, 100), (2000 rpm, 110): Ke = Σn²·Ke/Σn² = 108, linearity 8/108 = 7.41 % (by hand)", () => {
    const fit = fitBackEmfConstant([{ speedRpm: 1000, ke: 100 }, { speedRpm: 2000, ke: 110 }])!;
    expect(rel(fit.ke, 108)).toBeLessThan(1e-12);
    expect(rel(fit.linearityPercent, 800 / 108)).toBeLessThan(1e-12);
  });
});

describe("ratingSchema f = p·n/120 check (pins)", () => {
  const rating = (ratedSpeedRpm: number) =>
    ratingSchema.safeParse({ machineKind: "wound-field-alternator", nominalVoltageV: 400, voltageBasis: "line-line-rms", frequencyHz: 50, phases: 3, connection: "star", poles: 4, ratedSpeedRpm });
  it("ratingSchema accepts a nameplate exactly 1 % off p·n/120 (4 poles at 1515 rpm = 50.5 Hz against 50 Hz) and refuses 1515.0001 rpm (edge)", () => {
    expect(rating(1500).success).toBe(true);
    expect(rating(1515).success).toBe(true);
    expect(rating(1515.0001).success).toBe(false);
    expect(rating(1485).success).toBe(true);
    expect(rating(1484.9999).success).toBe(false);
  });
});

describe("speedWindow and captureFitsStep (pins)", () => {
  it("speedWindow(1500 rpm, 2 %) is 1470..1530 and captureFitsStep includes both ends, not one step outside", async () => {
    const { captureFitsStep, speedWindow } = await import("@/lib/analysis/test-plan");
    const w = speedWindow(1500, 2);
    expect(rel(w.speedMinRpm, 1470)).toBeLessThan(1e-12);
    expect(rel(w.speedMaxRpm, 1530)).toBeLessThan(1e-12);
    const step = { testKind: "no-load" as const, speedMinRpm: 1470, speedMaxRpm: 1530 };
    const fits = (speedRpm: number) => captureFitsStep(step, { testKind: "no-load", speedRpm });
    expect([fits(1470), fits(1530), fits(nextDown(1470)), fits(nextUp(1530))]).toEqual([true, true, false, false]);
  });
});
