import { computeDeviationFactor, type DeviationBasis } from "./deviation";
import { countFlatTops, scanWindow } from "./channel-scan";
import { computeHarmonics } from "./harmonics";
import { computeHarmonicGroups } from "./iec-grouping";
import { magnitude, type Complex } from "./phasors";
import { clippingWarning, dcOffsetWarning, flatTopRunSamples } from "./quality";
import { computeThf, computeTif } from "./telephone";
import { computeThd } from "./thd";
import type { CycleWindow } from "./cycles";
import type { ChannelReport } from "./report-schema";
import type { CaptureChannel, ChannelRole, QualityWarning } from "./types";

export interface ChannelContext {
  sampleRateHz: number;
  frequencyHz: number;
  window: CycleWindow;
  /** The leading part of `window` used for harmonics, phasors and the deviation factor. */
  harmonicWindow: CycleWindow;
  maxOrder: number;
  groupingIec: boolean;
  deviationBasis: DeviationBasis;
}

export interface ChannelAnalysis {
  channel: CaptureChannel;
  role: ChannelRole;
  report: ChannelReport;
  /** Peak phasor of the fundamental, referred to the first sample of the harmonic window. */
  fundamental: Complex;
  warnings: QualityWarning[];
}

/** Null for anything that is not a finite number, so no NaN reaches a report. */
export const finiteOrNull = (value: number | null | undefined): number | null =>
  value !== null && value !== undefined && Number.isFinite(value) ? value : null;

export function isVoltageRole(role: ChannelRole): boolean {
  return role.startsWith("v");
}

/** Everything the report says about one channel, over the shared whole-cycle window. */
export function analyseChannel(channel: CaptureChannel, role: ChannelRole, context: ChannelContext): ChannelAnalysis {
  const { sampleRateHz, frequencyHz, window, harmonicWindow } = context;
  const x = channel.samples;
  const warnings: QualityWarning[] = [];
  const samplesPerCycle = sampleRateHz / frequencyHz;
  const { mean: dc, meanSquare, peak } = scanWindow(x, window);
  const rms = Math.sqrt(Math.max(0, meanSquare));
  const acRms = Math.sqrt(Math.max(0, meanSquare - dc * dc));
  const components = computeHarmonics(x, sampleRateHz, frequencyHz, harmonicWindow, context.maxOrder);
  const first = components[0];
  const fundamental = first?.phasor ?? { re: 0, im: 0 };
  const fundamentalRms = first?.rms ?? 0;
  const harmonics = components.slice(1);
  const { thdFPercent, thdRPercent } = computeThd(fundamentalRms, harmonics.map((h) => h.rms));
  if (thdFPercent === null) {
    warnings.push({ code: "no-fundamental", message: `Channel "${channel.id}" has no component at the fundamental: distortion not computable` });
  }
  const voltage = isVoltageRole(role);
  const lines = components.map((c) => ({ frequencyHz: c.frequencyHz, rms: c.rms }));
  const groups = context.groupingIec ? computeHarmonicGroups(x, sampleRateHz, frequencyHz, harmonicWindow, context.maxOrder) : null;
  if (context.groupingIec && groups === null) {
    warnings.push({ code: "grouping-too-short", message: `Channel "${channel.id}": too few cycles for one IEC 61000-4-7 window (10 or 12 cycles)` });
  }
  const groupedFundamental = groups?.[0]?.rms ?? 0;
  const grouped = groups ? computeThd(groupedFundamental, groups.slice(1).map((g) => g.rms)).thdFPercent : null;
  const deviation = voltage
    ? computeDeviationFactor(x, sampleRateHz, frequencyHz, harmonicWindow, dc, acRms, Math.atan2(fundamental.im, fundamental.re), context.deviationBasis)
    : null;
  const flatTops = countFlatTops(x, harmonicWindow.start, harmonicWindow.start + Math.floor(harmonicWindow.spanSamples), flatTopRunSamples(samplesPerCycle));
  const clipping = clippingWarning(channel.id, flatTops.runs, flatTops.longestRun);
  // Only a voltage channel feeds the distortion checks; a clipped current is reported, not judged.
  if (clipping) warnings.push(clipping);
  const offset = dcOffsetWarning(channel.id, dc, magnitude(fundamental));
  if (offset) warnings.push(offset);
  const report: ChannelReport = {
    id: channel.id,
    role,
    unit: channel.unit,
    rms,
    dc,
    peak,
    crestFactor: rms > 0 ? peak / rms : null,
    fundamental: { rms: fundamentalRms, phaseDeg: first?.phaseDeg ?? 0 },
    harmonics: harmonics.map((h) => ({ order: h.order, rms: h.rms, phaseDeg: h.phaseDeg })),
    thdFPercent: finiteOrNull(thdFPercent),
    thdRPercent: finiteOrNull(thdRPercent),
    thfPercent: voltage ? finiteOrNull(computeThf(lines, rms)) : null,
    tif: voltage ? finiteOrNull(computeTif(lines, rms)) : null,
    deviationFactorPercent: finiteOrNull(deviation),
    harmonicGroups: groups,
    thdGroupedPercent: finiteOrNull(grouped),
  };
  return { channel, role, report, fundamental, warnings };
}
