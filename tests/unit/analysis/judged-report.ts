import { analyseCapture, profileFromPreset, ratingSchema, type AnalysisReport, type Rating, type ToleranceProfile } from "@/lib/analysis";
import { captureOf, synthesise } from "./signals";

/** A 400 V line-line, 50 Hz, 4-pole, 1500 rpm permanent-magnet generator of 500 kVA (invented). */
export const pmRating: Rating = ratingSchema.parse({
  machineKind: "pm-generator", nominalVoltageV: 400, voltageBasis: "line-line-rms", frequencyHz: 50, phases: 3, connection: "star",
  poles: 4, ratedSpeedRpm: 1500, ke: { value: 400 / 1.5, basis: "line-line-rms-per-krpm" }, ratedKva: 500,
});

/** The lab's own preset for pmRating, with TIF judged (≤ 50) so that every check has a band. */
export const pmProfile: ToleranceProfile = (() => {
  const profile = profileFromPreset("lab-own", pmRating);
  return { ...profile, checks: { ...profile.checks, tif: { required: true, source: { document: "Lab's own limit (common practice)", clause: "", verified: false }, max: 50 } } };
})();

/** Line-line set of `vll` volts RMS at 50 Hz, 20 kS/s, 10 cycles, as channels vab, vbc, vca. */
export function lineSet(vll: number, sampleRateHz = 20000, count = 4001, fifth = 0) {
  const make = (shift: number) => synthesise([{ order: 1, amplitude: vll * Math.SQRT2 }, { order: 5, amplitude: fifth * vll * Math.SQRT2 }], 50, sampleRateHz, count, shift);
  return [{ id: "vab", samples: make(0) }, { id: "vbc", samples: make((-2 * Math.PI) / 3) }, { id: "vca", samples: make((2 * Math.PI) / 3) }];
}

/** A clean rated capture of pmRating, analysed and judged at rated speed. */
export function cleanReport(): AnalysisReport {
  return analyseCapture(captureOf(lineSet(400), 20000), { rating: pmRating, profile: pmProfile, speedRpm: 1500 });
}

/**
 * A copy of `report` whose figure for `check` is set to `value` (every voltage channel alike, so
 * the worst channel and the mean both equal it).
 */
export function withFigure(report: AnalysisReport, check: string, value: number | string | null): AnalysisReport {
  const r = structuredClone(report);
  const tp = r.threePhase!;
  const be = r.backEmf!;
  switch (check) {
    case "voltage":
      for (const line of tp.lineToLine) line.rms = value as number;
      break;
    case "frequency":
      r.frequencyHz = value as number;
      break;
    case "thd":
      for (const c of r.channels) c.thdFPercent = value as number;
      break;
    case "individual-harmonic":
      for (const c of r.channels) {
        c.fundamental.rms = 100;
        c.harmonics = [{ order: 5, rms: value as number, phaseDeg: 0 }];
      }
      break;
    case "voltage-unbalance":
      tp.unbalance.vufPercent = value as number;
      break;
    case "phase-displacement":
      tp.displacementDeg = { ab: value as number, bc: 120, ca: 120 };
      break;
    case "phase-sequence":
      tp.sequence = value as "positive" | "negative";
      break;
    case "deviation-factor":
      for (const c of r.channels) c.deviationFactorPercent = value as number;
      break;
    case "thf":
      for (const c of r.channels) c.thfPercent = value as number;
      break;
    case "tif":
      for (const c of r.channels) c.tif = value as number;
      break;
    case "back-emf-constant":
      be.keLineRmsPerKrpm = value as number;
      break;
    case "pole-count":
      be.polesFromFrequency = value as number;
      break;
    default:
      throw new Error(`withFigure: unknown check ${check}`);
  }
  return r;
}
