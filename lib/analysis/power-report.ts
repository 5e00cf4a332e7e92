import { computePhasePower, computeTotalPower, neutralCurrentRms, type PhasePower } from "./power";
import { symmetricalComponents } from "./sequence";
import type { ChannelAnalysis } from "./channel-metrics";
import type { CycleWindow } from "./cycles";
import type { PowerReport } from "./report-schema";
import type { ThreePhaseResult } from "./three-phase";
import type { Complex } from "./phasors";
import type { ChannelRole, QualityWarning } from "./types";

const PAIRS: [ChannelRole, ChannelRole][] = [["van", "ia"], ["vbn", "ib"], ["vcn", "ic"]];

/** Power per phase and in total when currents sit beside line-neutral (or single) voltages. */
export function computePowerReport(
  analyses: readonly ChannelAnalysis[],
  threePhase: ThreePhaseResult | null,
  window: CycleWindow,
  warnings: QualityWarning[],
): PowerReport | null {
  const byRole = (role: ChannelRole): ChannelAnalysis | undefined => analyses.find((analysis) => analysis.role === role);
  const currents = analyses.filter((analysis) => analysis.role.startsWith("i"));
  if (currents.length === 0) return null;
  const toPower = (voltage: ChannelAnalysis, current: ChannelAnalysis): PhasePower =>
    computePhasePower(
      {
        voltageId: voltage.channel.id,
        currentId: current.channel.id,
        voltage: voltage.channel.samples,
        current: current.channel.samples,
        voltageRms: voltage.report.rms,
        currentRms: current.report.rms,
        voltageFundamental: voltage.fundamental,
        currentFundamental: current.fundamental,
      },
      window,
    );
  const pairs = PAIRS.map(([v, i]) => [byRole(v), byRole(i)] as const).filter((pair): pair is readonly [ChannelAnalysis, ChannelAnalysis] => !!pair[0] && !!pair[1]);
  const single = byRole("v");
  const phases = pairs.length > 0 ? pairs.map(([v, i]) => toPower(v, i)) : single && currents[0] ? [toPower(single, currents[0])] : [];
  if (phases.length === 0) {
    warnings.push({ code: "power-needs-line-neutral", message: "Currents were recorded without line-neutral (or single) voltages: power not computed" });
    return null;
  }
  const full = pairs.length === 3 && threePhase?.report.basis === "line-neutral";
  let effective = null;
  let positiveSequence: { voltage: Complex; current: Complex } | null = null;
  if (full) {
    const [a, b, c] = pairs.map(([, i]) => i) as [ChannelAnalysis, ChannelAnalysis, ChannelAnalysis];
    effective = {
      lineNeutralRms: pairs.map(([v]) => v.report.rms),
      lineLineRms: threePhase.report.lineToLine.map((line) => line.rms),
      currentRms: [a, b, c].map((i) => i.report.rms),
      neutralRms: neutralCurrentRms(a.channel.samples, b.channel.samples, c.channel.samples, window),
    };
    positiveSequence = { voltage: threePhase.positiveSequence, current: symmetricalComponents(a.fundamental, b.fundamental, c.fundamental).positive };
  }
  return { phases, total: computeTotalPower(phases, effective, positiveSequence) };
}
