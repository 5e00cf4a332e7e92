import { readFileSync } from "node:fs";
import path from "node:path";

export const FIXTURE_DIR = path.resolve(import.meta.dirname, "../../fixtures/analysis");

interface Component {
  order: number;
  rms: number;
  phaseDeg: number;
}

/** Output of scripts/fixtures/make_analysis_fixtures.py (numpy rfft, scipy periodogram and curve_fit). */
export interface ReferenceFixtures {
  distorted: {
    sampleRateHz: number;
    frequencyHz: number;
    cycles: number;
    samples: number[];
    rms: number;
    dc: number;
    components: Component[];
    periodogram: { frequencyHz: number; power: number }[];
    thdFPercent: number;
    thdRPercent: number;
  };
  sineFit: { sampleRateHz: number; samples: number[]; fitFrequencyHz: number; fitAmplitude: number; trueFrequencyHz: number };
  threePhase: {
    sampleRateHz: number;
    frequencyHz: number;
    phasors: { re: number; im: number }[];
    zero: number;
    positive: number;
    negative: number;
    vufPercent: number;
    lineLineRms: number[];
    displacementDeg: number[];
    samples: number[][];
  };
}

export const reference = JSON.parse(readFileSync(path.join(FIXTURE_DIR, "reference.json"), "utf8")) as ReferenceFixtures;
