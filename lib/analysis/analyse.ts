import { MAGNET_COEFFICIENTS_PERCENT_PER_K, computeBackEmf, computeSinglePhaseBackEmf, keAtReferenceTemperature, polesFromSpeed } from "./back-emf";
import { analyseChannel, finiteOrNull, isVoltageRole, type ChannelAnalysis } from "./channel-metrics";
import { wholeCycleWindow } from "./cycles";
import { estimateBySpectrum, estimateByZeroCrossings, refineFrequency } from "./frequency";
import { highestOrderBelowNyquist } from "./harmonics";
import { analysisOptionsSchema, type AnalysisOptions } from "./options";
import { computePowerReport } from "./power-report";
import { FEW_CYCLES_INVALIDATES, SAMPLE_RATE_INVALIDATES } from "./invalidation";
import { polePairWarning } from "./quality";
import { checkChannelValues } from "./sample-check";
import { CaptureRejection } from "./rejection";
import { suggestChannelRoles } from "./roles";
import { analyseThreePhase } from "./three-phase";
import { ANALYSIS_VERSION } from "./version";
import { judgeMeasured, overallStatus, type JudgeOptions } from "./verdicts";
import type { AnalysisReport, BackEmfReport } from "./report-schema";
import type { ChannelRole, ParsedCapture, QualityWarning } from "./types";

const MIN_CYCLES = 2;
const FEW_CYCLES = 5;
/**
 * Harmonics are taken over at most this many samples (whole cycles from the start): the spectrum of a
 * steady machine settles long before, and O(N·H) work on 10^7 samples would dominate the run.
 */
const HARMONIC_WINDOW_SAMPLES = 1 << 18;
const LEVEL_SAMPLES = 1 << 16;
/** The zero-crossing cross-check reads the leading 2^20 samples: hundreds of cycles at bench rates. */
const CROSSING_SAMPLES = 1 << 20;
const REFERENCE_ORDER: ChannelRole[] = ["van", "vab", "v", "vbn", "vbc", "vcn", "vca", "ia", "ib", "ic"];

/** Frequency of the reference channel: coarse FFT (or zero crossings), then phase-drift refinement. */
function measureFrequency(samples: Float64Array, sampleRateHz: number, id: string, warnings: QualityWarning[]): { frequencyHz: number; zeroCrossingHz: number | null } {
  // Crossing level and hysteresis from the leading stretch: plenty of cycles, one pass fewer.
  const lead = Math.min(samples.length, LEVEL_SAMPLES);
  let sum = 0;
  let max = Number.NEGATIVE_INFINITY;
  let min = Number.POSITIVE_INFINITY;
  for (let n = 0; n < lead; n++) {
    const v = samples[n] as number;
    sum += v;
    if (v > max) max = v;
    if (v < min) min = v;
  }
  const mean = sum / lead;
  const amplitude = Math.max(max - mean, mean - min);
  const crossings = estimateByZeroCrossings(samples.subarray(0, CROSSING_SAMPLES), sampleRateHz, mean, amplitude);
  const spectral = estimateBySpectrum(samples, sampleRateHz, mean);
  const spectralAgrees = spectral !== null && (crossings === null || Math.abs(spectral - crossings.frequencyHz) <= 0.05 * crossings.frequencyHz);
  const coarse = spectralAgrees ? spectral : (crossings?.frequencyHz ?? null);
  if (coarse === null || !(coarse > 0)) {
    throw new CaptureRejection("no-fundamental", "No periodic signal found: the reference channel never crosses its mean level twice", { column: id });
  }
  const refined = refineFrequency(samples, sampleRateHz, coarse);
  const frequencyHz = Number.isFinite(refined) && refined > 0 ? refined : coarse;
  if (crossings && Math.abs(crossings.frequencyHz - frequencyHz) > 0.01 * frequencyHz) {
    warnings.push({
      code: "frequency-cross-check",
      message: `Zero crossings give ${crossings.frequencyHz.toFixed(4)} Hz against ${frequencyHz.toFixed(4)} Hz from the spectrum: the waveform may be noisy or heavily distorted`,
    });
  }
  return { frequencyHz, zeroCrossingHz: crossings ? crossings.frequencyHz : null };
}

/**
 * Analyses a parsed capture: per-channel metrics over the longest whole-cycle window, three-phase
 * quantities, back-EMF constants, power and verdicts. Throws CaptureRejection when the capture
 * holds too little to analyse; everything else not computable is null with a warning.
 */
export function analyseCapture(capture: ParsedCapture, options: AnalysisOptions = {}): AnalysisReport {
  const opts = analysisOptionsSchema.parse(options);
  const warnings: QualityWarning[] = [...capture.warnings];
  const { sampleRateHz } = capture;
  if (capture.channels.length === 0) throw new CaptureRejection("no-channels", "The capture has no channels to analyse");
  for (const channel of capture.channels) checkChannelValues(channel);
  for (const applied of capture.probeScales ?? []) {
    if (applied.from === "preamble") {
      warnings.push({ code: "probe-ratio-from-preamble", level: "info", channel: applied.channel, message: `Probe ratio ×${applied.scale} applied to channel "${applied.channel}" as the instrument preamble states ("${applied.statement}"); give a ratio for the channel to override it` });
    }
  }
  const suggested = suggestChannelRoles(capture.channels.map((channel) => channel.id));
  const roles = capture.channels.map((channel) => opts.channelRoles?.[channel.id] ?? suggested[channel.id] ?? "v");
  const referenceIndex = REFERENCE_ORDER.map((role) => roles.indexOf(role)).find((index) => index >= 0) ?? 0;
  const reference = capture.channels[referenceIndex] as ParsedCapture["channels"][number];
  const { frequencyHz, zeroCrossingHz } = measureFrequency(reference.samples, sampleRateHz, reference.id, warnings);
  const window = wholeCycleWindow(capture.sampleCount, sampleRateHz, frequencyHz);
  if (!window || window.cycles < MIN_CYCLES) {
    throw new CaptureRejection("too-few-cycles", `Only ${window?.cycles ?? 0} whole cycle(s) of ${frequencyHz.toPrecision(5)} Hz: at least ${MIN_CYCLES} are needed`, { column: reference.id });
  }
  if (window.cycles < FEW_CYCLES) {
    warnings.push({
      code: "few-cycles",
      message: `Only ${window.cycles} whole cycles (${FEW_CYCLES} needed): frequency, harmonics and phasors are not settled, so the checks drawn from them are not judged`,
      invalidates: [...FEW_CYCLES_INVALIDATES],
    });
  }
  const highest = highestOrderBelowNyquist(sampleRateHz, frequencyHz);
  if (highest < opts.harmonics) {
    warnings.push({
      code: "sample-rate-low",
      message: `At ${sampleRateHz.toPrecision(5)} S/s harmonics stop at order ${highest} (fs must exceed 2·H·f1 = ${(2 * opts.harmonics * frequencyHz).toPrecision(5)} S/s for H = ${opts.harmonics}): distortion figures are not judged`,
      invalidates: [...SAMPLE_RATE_INVALIDATES],
    });
  }
  const harmonicCycles = Math.min(window.cycles, Math.max(10, Math.floor(HARMONIC_WINDOW_SAMPLES / (sampleRateHz / frequencyHz))));
  const harmonicWindow = wholeCycleWindow(capture.sampleCount, sampleRateHz, frequencyHz, 0, harmonicCycles) ?? window;
  const context = { sampleRateHz, frequencyHz, window, harmonicWindow, maxOrder: opts.harmonics, groupingIec: opts.groupingIec, deviationBasis: opts.deviationBasis };
  // TIF is computed on every voltage channel; whether it is judged is the rating's matter (60 Hz).
  const analyses: ChannelAnalysis[] = capture.channels.map((channel, index) => analyseChannel(channel, roles[index] as ChannelRole, context));
  for (const analysis of analyses) warnings.push(...analysis.warnings);
  const threePhase = analyseThreePhase(analyses, window);
  const backEmf = computeBackEmfReport(analyses, threePhase?.report ?? null, frequencyHz, opts, warnings);
  const power = computePowerReport(analyses, threePhase, window, warnings);
  if (opts.harmonics * frequencyHz < 5000 && analyses.some((analysis) => isVoltageRole(analysis.role))) {
    warnings.push({ code: "thf-band-limited", message: `THF sums harmonics up to ${(Math.min(opts.harmonics, highest) * frequencyHz).toFixed(0)} Hz, short of the 5 kHz of IEC 60034-1: raise the harmonic order for a full THF` });
  }
  const measured = { channels: analyses.map((analysis) => analysis.report), frequencyHz, threePhase: threePhase?.report ?? null, backEmf };
  const judged = opts.rating && opts.profile
    ? judgeMeasured({ ...measured, warnings, referenceChannel: reference.id }, { rating: opts.rating, profile: opts.profile, checks: opts.checks, stepName: opts.stepName, instruments: opts.instruments })
    : { verdicts: [], warnings, uncertainty: undefined };
  const verdicts = judged.verdicts;
  return {
    analysisVersion: ANALYSIS_VERSION,
    sampleRateHz,
    sampleCount: capture.sampleCount,
    durationS: capture.sampleCount / sampleRateHz,
    cyclesAnalysed: window.cycles,
    harmonicCycles: harmonicWindow.cycles,
    frequencyZeroCrossingHz: finiteOrNull(zeroCrossingHz),
    referenceChannel: reference.id,
    deviationBasis: opts.deviationBasis,
    ...measured,
    power,
    warnings: judged.warnings,
    ...(capture.probeScales && capture.probeScales.length > 0 ? { probeScales: capture.probeScales } : {}),
    verdicts,
    overall: overallStatus(verdicts),
    ...(opts.profile && judged.uncertainty ? { decisionRule: opts.profile.decisionRule, uncertainty: judged.uncertainty } : {}),
  };
}

/**
 * Judges a stored report again (a new profile version, another plan step) from the figures it holds,
 * without reading the file: the same verdicts the analysis would have given.
 */
export function judgeReport(report: AnalysisReport, options: JudgeOptions): AnalysisReport {
  // The instruments stay those recorded with the report unless the caller gives the capture's current set.
  const instruments = options.instruments ?? report.uncertainty?.instruments ?? [];
  const { verdicts, warnings, uncertainty } = judgeMeasured(report, { ...options, instruments });
  return { ...report, warnings, verdicts, overall: overallStatus(verdicts), decisionRule: options.profile.decisionRule, uncertainty };
}

function computeBackEmfReport(
  analyses: readonly ChannelAnalysis[],
  threePhase: AnalysisReport["threePhase"],
  frequencyHz: number,
  opts: ReturnType<typeof analysisOptionsSchema.parse>,
  warnings: QualityWarning[],
): BackEmfReport | null {
  if (opts.speedRpm === undefined) return null;
  const polesFromFrequency = polesFromSpeed(frequencyHz, opts.speedRpm);
  const poleWarning = polePairWarning(polesFromFrequency);
  if (poleWarning) warnings.push(poleWarning);
  const singlePhase = opts.rating?.phases === 1;
  const lines = singlePhase ? undefined : threePhase?.lineToLine.map((line) => line.fundamentalRms);
  let lineRms = lines && lines.length > 0 ? lines.reduce((sum, value) => sum + value, 0) / lines.length : undefined;
  if (lineRms === undefined) {
    const single = analyses.find((analysis) => isVoltageRole(analysis.role));
    if (!single) {
      warnings.push({ code: "back-emf-no-voltage", message: "A speed was given but no voltage channel is present: back-EMF constant not computable" });
      return null;
    }
    const phaseRole = ["van", "vbn", "vcn"].includes(single.role);
    if (singlePhase) {
      // A single-phase machine's Ke is per phase: the one winding's voltage, no √3 (DOMAIN §1).
      lineRms = single.report.fundamental.rms;
      warnings.push({ code: "back-emf-single-phase", level: "info", message: `Back-EMF constant taken from the winding voltage on channel "${single.channel.id}" (single-phase machine: per phase, no √3)` });
    } else {
      lineRms = single.report.fundamental.rms * (phaseRole ? Math.sqrt(3) : 1);
      warnings.push({
        code: "back-emf-single-channel",
        message: phaseRole
          ? `Back-EMF constant taken from line-neutral channel "${single.channel.id}" × √3 (a balanced set assumed)`
          : `Back-EMF constant taken from channel "${single.channel.id}" as a line-line voltage`,
      });
    }
  }
  const poles = opts.poles ?? opts.rating?.poles ?? Math.max(2, 2 * Math.round(polesFromFrequency / 2));
  const result = singlePhase ? computeSinglePhaseBackEmf(lineRms, opts.speedRpm, poles) : computeBackEmf(lineRms, opts.speedRpm, poles);
  const magnet = opts.magnetTemperature;
  const corrected = magnet
    ? keAtReferenceTemperature(result.keLineRmsPerKrpm, magnet.measuredC, magnet.referenceC, magnet.coefficientPercentPerK ?? MAGNET_COEFFICIENTS_PERCENT_PER_K[magnet.material])
    : null;
  return {
    ...result,
    polesFromFrequency,
    basis: "fundamental",
    keLineRmsPerKrpmAtReference: finiteOrNull(corrected),
    referenceTemperatureC: magnet ? magnet.referenceC : null,
  };
}
