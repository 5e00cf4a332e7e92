import { z } from "zod";
import { DECISION_RULES } from "./decision-rule";
import { CHANNEL_ROLES } from "./types";
import { uncertaintySectionSchema } from "./uncertainty";

/** Numbers in a report are always finite: "not computable" is null plus a warning. */
const finite = z.number();
const maybe = finite.nullable();

export const channelRoleSchema = z.enum(CHANNEL_ROLES);

const harmonicSchema = z.object({ order: z.number().int().min(2), rms: finite, phaseDeg: finite });

const channelReportSchema = z.object({
  id: z.string(),
  role: channelRoleSchema,
  unit: z.enum(["V", "A"]),
  rms: finite,
  dc: finite,
  peak: finite,
  crestFactor: maybe,
  fundamental: z.object({ rms: finite, phaseDeg: finite }),
  harmonics: z.array(harmonicSchema),
  thdFPercent: maybe,
  thdRPercent: maybe,
  thfPercent: maybe,
  tif: maybe,
  deviationFactorPercent: maybe,
  /** IEC 61000-4-7 harmonic groups, when grouping was asked for. */
  harmonicGroups: z.array(z.object({ order: z.number().int().min(1), rms: finite })).nullable(),
  thdGroupedPercent: maybe,
});

const threePhaseSchema = z.object({
  basis: z.enum(["line-neutral", "line-line"]),
  sequence: z.enum(["positive", "negative"]),
  displacementDeg: z.object({ ab: finite, bc: finite, ca: finite }),
  /** RMS magnitudes of the fundamental symmetrical components. */
  sequenceComponents: z.object({ positive: finite, negative: finite, zero: finite }),
  unbalance: z.object({ nemaPercent: maybe, ieeePercent: maybe, vufPercent: maybe }),
  lineToLine: z.array(z.object({ id: z.string(), rms: finite, fundamentalRms: finite, source: z.enum(["measured", "derived"]) })),
});

const backEmfSchema = z.object({
  speedRpm: finite,
  poles: z.number().int(),
  polesFromFrequency: finite,
  expectedFrequencyHz: finite,
  keLineRmsPerKrpm: finite,
  keLinePeakPerKrpm: finite,
  kePhasePeakPerRadS: finite,
  keLineRmsVsPerRad: finite,
  /**
   * Phase RMS per krpm: from the one winding of a single-phase machine (no √3), V_LL/√3 of a
   * three-phase set (star equivalent). Absent in reports before engine 2.1.0.
   */
  kePhaseRmsPerKrpm: finite.optional(),
  ktNmPerArms: finite,
  basis: z.literal("fundamental"),
  /** Ke_LL,rms per krpm corrected to `referenceTemperatureC`, when a magnet temperature was given. */
  keLineRmsPerKrpmAtReference: maybe.optional(),
  referenceTemperatureC: maybe.optional(),
});

const phasePowerSchema = z.object({
  voltageId: z.string(),
  currentId: z.string(),
  activePowerW: finite,
  fundamentalActivePowerW: finite,
  fundamentalReactivePowerVar: finite,
  apparentPowerVa: finite,
  fundamentalApparentPowerVa: finite,
  powerFactor: maybe,
  fundamentalPowerFactor: maybe,
});

const powerSchema = z.object({
  phases: z.array(phasePowerSchema),
  total: z.object({
    activePowerW: finite,
    fundamentalActivePowerW: finite,
    fundamentalReactivePowerVar: finite,
    effectiveApparentPowerVa: finite,
    powerFactor: maybe,
    positiveSequenceActivePowerW: maybe,
  }),
});

/**
 * A warning as a sentence; `invalidates` lists the checks it makes inconclusive (for `channel` only,
 * when set), `level` "alert" marks a plausibility warning to show prominently, "info" a plain note.
 */
export const warningSchema = z.object({
  code: z.string(),
  message: z.string(),
  level: z.enum(["info", "warning", "alert"]).optional(),
  invalidates: z.array(z.string()).optional(),
  channel: z.string().optional(),
});

const probeScaleSchema = z.object({
  channel: z.string(),
  scale: finite,
  from: z.enum(["caller", "preamble"]),
  /** The preamble line it was read from, for `from: "preamble"`. */
  statement: z.string().nullable(),
});

/**
 * pass < marginal < inconclusive < fail (see verdicts.ts); "not-required" takes no part in the overall.
 * "not-applicable" appears only in reports made before engine 2.0.0.
 */
export const verdictStatusSchema = z.enum(["pass", "marginal", "inconclusive", "fail", "not-required", "not-applicable"]);

export const verdictSchema = z.object({
  check: z.string(),
  label: z.string(),
  measured: z.union([finite, z.string()]).nullable(),
  unit: z.string(),
  lower: maybe,
  upper: maybe,
  status: verdictStatusSchema,
  /** Why a check is inconclusive or not required, in words. */
  reason: z.string().nullable().optional(),
  basis: z.string(),
  /** The limit's source in words ("IEC 60034-1, zone A … — source not verified"). */
  source: z.string(),
  /** Expanded uncertainty (k = 2) in `unit` where evaluated, else null; absent before engine 2.2.0. */
  expandedUncertainty: maybe.optional(),
});

export const analysisReportSchema = z.object({
  analysisVersion: z.string(),
  sampleRateHz: finite,
  sampleCount: z.number().int(),
  durationS: finite,
  cyclesAnalysed: z.number().int(),
  /** Whole cycles (from the start) behind harmonics, phasors, THD and the deviation factor. */
  harmonicCycles: z.number().int(),
  frequencyHz: finite,
  /** Zero-crossing estimate, kept as a cross-check of `frequencyHz`. */
  frequencyZeroCrossingHz: maybe,
  referenceChannel: z.string(),
  /** How `deviationFactorPercent` was reduced over the cycles examined (always set by the engine). */
  deviationBasis: z.enum(["average-cycle", "worst-cycle"]).optional(),
  channels: z.array(channelReportSchema),
  threePhase: threePhaseSchema.nullable(),
  backEmf: backEmfSchema.nullable(),
  power: powerSchema.nullable(),
  warnings: z.array(warningSchema),
  /** Probe ratios applied while reading the file: the caller's, or the instrument preamble's. */
  probeScales: z.array(probeScaleSchema).optional(),
  verdicts: z.array(verdictSchema),
  overall: verdictStatusSchema,
  /** The profile's decision rule the verdicts follow (absent before engine 2.2.0: simple acceptance). */
  decisionRule: z.enum(DECISION_RULES).optional(),
  /** Type B budgets of voltage, frequency and Ke from the capture's instruments (engine 2.2.0 on). */
  uncertainty: uncertaintySectionSchema.optional(),
});

export type AnalysisReport = z.infer<typeof analysisReportSchema>;
export type ChannelReport = z.infer<typeof channelReportSchema>;
export type ThreePhaseReport = z.infer<typeof threePhaseSchema>;
export type BackEmfReport = z.infer<typeof backEmfSchema>;
export type PowerReport = z.infer<typeof powerSchema>;
export type Verdict = z.infer<typeof verdictSchema>;
export type ReportWarning = z.infer<typeof warningSchema>;
export type VerdictStatus = z.infer<typeof verdictStatusSchema>;
