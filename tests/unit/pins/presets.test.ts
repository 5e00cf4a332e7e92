import { describe, expect, it } from "vitest";
import { ieee519Limits, profileFromPreset, thfLimitForKva } from "@/lib/analysis/tolerance-presets";
import { ratingSchema } from "@/lib/analysis/rating";
import { nextDown, nextUp } from "./steps";

const rating = (over: Record<string, unknown> = {}) =>
  ratingSchema.parse({ machineKind: "wound-field-alternator", nominalVoltageV: 400, voltageBasis: "line-line-rms", frequencyHz: 60, phases: 3, connection: "star", poles: 4, ratedSpeedRpm: 1800, ratedKva: 500, ...over });

describe("thfLimitForKva (pins: IEC 60034-1 THF limits by rated output, from memory as the source says)", () => {
  it.each([
    [undefined, null], [nextDown(300), null], [300, 5], [nextDown(1000), 5], [1000, 1.5], [nextDown(5000), 1.5], [5000, 1], [nextUp(5000), 1],
  ])("thfLimitForKva(%s kVA) is %s %%", (kva, limit) => {
    expect(thfLimitForKva(kva)).toBe(limit);
  });
});

describe("ieee519Limits (pins: IEEE Std 519-2014 Table 1)", () => {
  it.each([
    [1000, 8, 5], [nextUp(1000), 5, 3], [69_000, 5, 3], [nextUp(69_000), 2.5, 1.5], [161_000, 2.5, 1.5], [nextUp(161_000), 1.5, 1],
  ])("ieee519Limits(%d V) is THD %d %%, single harmonic %d %% (V ≤ 1 kV: 8/5; ≤ 69 kV: 5/3; ≤ 161 kV: 2.5/1.5; above: 1.5/1)", (volts, thd, individual) => {
    expect(ieee519Limits(volts)).toEqual({ thd, individual });
  });
});

describe("profileFromPreset (pins)", () => {
  const bands = (id: Parameters<typeof profileFromPreset>[0]) => {
    const c = profileFromPreset(id, rating()).checks;
    const pct = (r: (typeof c)["voltage"]) => (r.required ? [r.lowerPercent, r.upperPercent] : null);
    return { voltage: pct(c.voltage), frequency: pct(c.frequency) };
  };

  it("profileFromPreset gives the ISO 8528-5 classes G1 ±5 %/±2.5 %, G2 ±2.5 %/±1.5 %, G3 ±1 %/±0.5 % (voltage/frequency, source not verified)", () => {
    expect(bands("iso-8528-5-g1")).toEqual({ voltage: [-5, 5], frequency: [-2.5, 2.5] });
    expect(bands("iso-8528-5-g2")).toEqual({ voltage: [-2.5, 2.5], frequency: [-1.5, 1.5] });
    expect(bands("iso-8528-5-g3")).toEqual({ voltage: [-1, 1], frequency: [-0.5, 0.5] });
  });

  it("profileFromPreset gives IEC 60034-1 zone A: voltage ±5 %, frequency ±2 % (from memory, as the source says)", () => {
    expect(bands("iec-60034-1")).toEqual({ voltage: [-5, 5], frequency: [-2, 2] });
  });

  it("profileFromPreset's lab-own limits: TIF ≤ 50, pole count ±2 % (common practice, the preset's documented starting points)", () => {
    const c = profileFromPreset("lab-own", rating()).checks;
    expect(c.tif).toMatchObject({ required: true, max: 50 });
    expect(c["pole-count"]).toMatchObject({ required: true, lowerPercent: -2, upperPercent: 2 });
  });

  it("profileFromPreset judges TIF for ratings within 0.5 Hz of 60 Hz, edges included (60.5 and 59.5 Hz), not one step beyond", () => {
    const tif = (frequencyHz: number) => profileFromPreset("lab-own", rating({ frequencyHz, ratedSpeedRpm: (120 * frequencyHz) / 4 })).checks.tif.required;
    expect([tif(60.5), tif(59.5), tif(nextUp(60.5)), tif(nextDown(59.5))]).toEqual([true, true, false, false]);
  });
});
