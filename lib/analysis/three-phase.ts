import { spanPairMean } from "./goertzel";
import { displacementDeg, magnitude, subtract, type Complex } from "./phasors";
import { computeMaxDeviationUnbalance, computeVuf, symmetricalComponents } from "./sequence";
import { finiteOrNull, type ChannelAnalysis } from "./channel-metrics";
import type { CycleWindow } from "./cycles";
import type { ThreePhaseReport } from "./report-schema";
import type { ChannelRole } from "./types";

export interface ThreePhaseResult {
  report: ThreePhaseReport;
  positiveSequence: Complex;
}

function pick(analyses: readonly ChannelAnalysis[], role: ChannelRole): ChannelAnalysis | undefined {
  return analyses.find((analysis) => analysis.role === role);
}

/**
 * Displacement, sequence, symmetrical components and unbalance from a full set of line-neutral
 * channels (preferred) or line-line channels. Line-line values are derived sample by sample
 * (v_ab = v_an − v_bn) when only line-neutral channels were recorded.
 */
export function analyseThreePhase(analyses: readonly ChannelAnalysis[], window: CycleWindow): ThreePhaseResult | null {
  const an = pick(analyses, "van");
  const bn = pick(analyses, "vbn");
  const cn = pick(analyses, "vcn");
  const ab = pick(analyses, "vab");
  const bc = pick(analyses, "vbc");
  const ca = pick(analyses, "vca");
  let set: [ChannelAnalysis, ChannelAnalysis, ChannelAnalysis];
  let basis: ThreePhaseReport["basis"];
  let lineToLine: ThreePhaseReport["lineToLine"];
  if (an && bn && cn) {
    set = [an, bn, cn];
    basis = "line-neutral";
    const pairs: [string, ChannelAnalysis, ChannelAnalysis][] = [["vab", an, bn], ["vbc", bn, cn], ["vca", cn, an]];
    lineToLine = pairs.map(([id, first, second]) => ({
      id,
      rms: Math.sqrt(Math.max(0, spanPairMean(first.channel.samples, second.channel.samples, window.start, window.spanSamples, "difference-squared"))),
      fundamentalRms: magnitude(subtract(first.fundamental, second.fundamental)) / Math.SQRT2,
      source: "derived" as const,
    }));
  } else if (ab && bc && ca) {
    set = [ab, bc, ca];
    basis = "line-line";
    lineToLine = set.map((analysis) => ({
      id: analysis.channel.id,
      rms: analysis.report.rms,
      fundamentalRms: analysis.report.fundamental.rms,
      source: "measured" as const,
    }));
  } else {
    return null;
  }
  const [a, b, c] = set.map((analysis) => analysis.fundamental) as [Complex, Complex, Complex];
  const components = symmetricalComponents(a, b, c);
  const positive = magnitude(components.positive);
  const negative = magnitude(components.negative);
  return {
    positiveSequence: components.positive,
    report: {
      basis,
      sequence: positive >= negative ? "positive" : "negative",
      displacementDeg: { ab: displacementDeg(a, b), bc: displacementDeg(b, c), ca: displacementDeg(c, a) },
      sequenceComponents: {
        positive: positive / Math.SQRT2,
        negative: negative / Math.SQRT2,
        zero: magnitude(components.zero) / Math.SQRT2,
      },
      unbalance: {
        nemaPercent: finiteOrNull(computeMaxDeviationUnbalance(lineToLine.map((line) => line.rms))),
        ieeePercent: basis === "line-neutral" ? finiteOrNull(computeMaxDeviationUnbalance(set.map((s) => s.report.rms))) : null,
        vufPercent: finiteOrNull(computeVuf(components.positive, components.negative)),
      },
      lineToLine,
    },
  };
}
