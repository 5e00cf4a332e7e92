import { largestHarmonic } from "./thd";
import { KE_BASIS_UNITS, type Rating } from "./rating";
import type { AnalysisReport, Verdict, VerdictStatus } from "./report-schema";
import { CHECK_IDS, CHECK_LABELS, describeSource, type CheckId, type CheckRule, type ToleranceProfile } from "./tolerance";
import { keInBasis } from "./ke-basis";

type Measured = Pick<AnalysisReport, "channels" | "frequencyHz" | "threePhase" | "backEmf" | "warnings">;

/**
 * The order verdicts are combined in: pass < marginal < inconclusive < fail. A check that could not be
 * judged (missing, not finite, invalidated by a warning) is worse than a marginal pass because nothing
 * passes on missing evidence, and better than a measured failure because it may still pass once
 * measured again. Checks not required for the rating take no part.
 */
export const VERDICT_ORDER = ["pass", "marginal", "inconclusive", "fail"] as const;

export type Band = { lower: number | null; upper: number | null; nominal: number; marginalZonePercent: number };

/**
 * Pass, fail, or marginal: inside the band but within `marginalZonePercent` of the distance from the
 * nominal value to the edge it is near. A band edge itself is inside (limits are inclusive). A value
 * that is missing or not finite is inconclusive.
 */
export function judge(measured: number | null, band: Band): VerdictStatus {
  if (measured === null || !Number.isFinite(measured)) return "inconclusive";
  const { lower, upper, nominal } = band;
  if ((lower !== null && measured < lower) || (upper !== null && measured > upper)) return "fail";
  const zone = band.marginalZonePercent / 100;
  if (upper !== null && measured > upper - zone * Math.abs(upper - nominal)) return "marginal";
  if (lower !== null && measured < lower + zone * Math.abs(nominal - lower)) return "marginal";
  return "pass";
}

/** The worst judged status; "inconclusive" when nothing at all was judged. */
export function overallStatus(verdicts: readonly Pick<Verdict, "status">[]): VerdictStatus {
  let worst = -1;
  for (const v of verdicts) worst = Math.max(worst, (VERDICT_ORDER as readonly string[]).indexOf(v.status));
  return worst < 0 ? "inconclusive" : VERDICT_ORDER[worst] as VerdictStatus;
}

const maxOf = (values: (number | null)[]): number | null => {
  const present = values.filter((value): value is number => value !== null && Number.isFinite(value));
  return present.length > 0 ? Math.max(...present) : null;
};
const mean = (values: number[]): number | null => (values.length > 0 ? values.reduce((s, v) => s + v, 0) / values.length : null);

export type JudgeOptions = {
  rating: Rating;
  profile: ToleranceProfile;
  /** The plan step's checks; the others are not required for this capture. All when absent. */
  checks?: readonly CheckId[];
  stepName?: string;
};

type Figure = { value: number | string | null; unit: string; basis: string; band?: Band; expected?: string };

function figures(measured: Measured, rating: Rating, profile: ToleranceProfile): Record<CheckId, Figure> {
  const zone = profile.marginalZonePercent;
  const checks = profile.checks;
  const voltages = measured.channels.filter((c) => c.unit === "V");
  const lineVoltages = voltages.filter((c) => ["vab", "vbc", "vca"].includes(c.role));
  const waveform = lineVoltages.length > 0 ? lineVoltages : voltages;
  const tp = measured.threePhase;
  // Away from rated speed the nameplate values move with the shaft: f = p·n/120 and, at constant
  // excitation, the EMF is proportional to speed (Faraday's law). Within 1 % the nameplate stands.
  const speed = measured.backEmf?.speedRpm ?? null;
  const ratio = speed !== null ? speed / rating.ratedSpeedRpm : 1;
  const offRated = Math.abs(ratio - 1) > 0.01;
  const atSpeed = offRated ? ` (nameplate scaled to the test speed, ${speed} rpm)` : "";
  const relative = (rule: CheckRule, nominal: number): Band | undefined =>
    rule.required && "lowerPercent" in rule ? { lower: nominal * (1 + rule.lowerPercent / 100), upper: nominal * (1 + rule.upperPercent / 100), nominal, marginalZonePercent: zone } : undefined;
  const upTo = (rule: CheckRule): Band | undefined =>
    rule.required && "maxPercent" in rule ? { lower: null, upper: rule.maxPercent, nominal: 0, marginalZonePercent: zone } : undefined;

  const lineLevel = rating.voltageBasis === "line-line-rms";
  const voltage = lineLevel
    ? mean(tp?.lineToLine.map((l) => l.rms) ?? (rating.phases === 1 ? voltages.slice(0, 1).map((c) => c.rms) : []))
    : mean(voltages.filter((c) => ["van", "vbn", "vcn", "v"].includes(c.role)).map((c) => c.rms));
  const vNominal = rating.nominalVoltageV * (offRated ? ratio : 1);
  const fNominal = offRated && speed !== null ? (rating.poles * speed) / 120 : rating.frequencyHz;

  const unbalanceRule = checks["voltage-unbalance"];
  const definition = unbalanceRule.required ? unbalanceRule.definition : "vuf";
  const unbalanceKey = definition === "nema" ? "nemaPercent" : definition === "ieee" ? "ieeePercent" : "vufPercent";
  const unbalanceNames = { nema: "NEMA MG 1 line-voltage unbalance", ieee: "IEEE phase-voltage unbalance", vuf: "VUF = |V2|/|V1|" } as const;

  const nominalDisplacement = rating.phases === 3 ? 120 : rating.phases === 2 ? 90 : 180;
  const displacements = tp ? Object.values(tp.displacementDeg).map((v) => Math.abs(v)) : [];
  const worstDisplacement = displacements.length > 0 ? displacements.reduce((w, v) => (Math.abs(v - nominalDisplacement) > Math.abs(w - nominalDisplacement) ? v : w)) : null;
  const dRule = checks["phase-displacement"];
  const sRule = checks["phase-sequence"];
  const tifRule = checks.tif;

  const ke = rating.ke ? keInBasis(measured.backEmf, rating.ke.basis) : null;
  const keNominal = rating.ke?.value ?? 0;

  return {
    voltage: { value: voltage, unit: "V", basis: (lineLevel ? "mean line-line true RMS" : "mean line-neutral true RMS") + atSpeed, band: relative(checks.voltage, vNominal) },
    frequency: { value: measured.frequencyHz, unit: "Hz", basis: "fundamental frequency of the reference channel" + (offRated ? ` against p·n/120 at ${speed} rpm` : ""), band: relative(checks.frequency, fNominal) },
    thd: { value: maxOf(waveform.map((c) => c.thdFPercent)), unit: "%", basis: "THD-F, worst voltage channel", band: upTo(checks.thd) },
    "individual-harmonic": { value: maxOf(waveform.map((c) => largestHarmonic(c.fundamental.rms, c.harmonics)?.percent ?? null)), unit: "%", basis: "percent of the fundamental, worst voltage channel", band: upTo(checks["individual-harmonic"]) },
    "voltage-unbalance": { value: tp ? tp.unbalance[unbalanceKey] : null, unit: "%", basis: unbalanceNames[definition], band: upTo(unbalanceRule) },
    "phase-displacement": {
      value: worstDisplacement, unit: "°", basis: "worst of the three fundamental displacements",
      band: dRule.required ? { lower: nominalDisplacement - dRule.toleranceDeg, upper: nominalDisplacement + dRule.toleranceDeg, nominal: nominalDisplacement, marginalZonePercent: zone } : undefined,
    },
    "phase-sequence": { value: tp?.sequence ?? null, unit: "", basis: "from symmetrical components", expected: sRule.required ? sRule.expected : undefined },
    "deviation-factor": { value: maxOf(waveform.map((c) => c.deviationFactorPercent)), unit: "%", basis: "worst voltage channel", band: upTo(checks["deviation-factor"]) },
    thf: { value: maxOf(waveform.map((c) => c.thfPercent)), unit: "%", basis: "worst voltage channel, harmonics to 5 kHz", band: upTo(checks.thf) },
    tif: { value: maxOf(waveform.map((c) => c.tif)), unit: "", basis: "worst voltage channel", band: tifRule.required ? { lower: null, upper: tifRule.max, nominal: 0, marginalZonePercent: zone } : undefined },
    "back-emf-constant": {
      value: ke, unit: rating.ke ? KE_BASIS_UNITS[rating.ke.basis] : "V/krpm",
      basis: measured.backEmf?.keLineRmsPerKrpmAtReference != null ? `fundamental, at ${measured.backEmf.referenceTemperatureC} °C` : "fundamental",
      band: relative(checks["back-emf-constant"], keNominal),
    },
    "pole-count": { value: measured.backEmf?.polesFromFrequency ?? null, unit: "", basis: "120·f/n against the rating", band: relative(checks["pole-count"], rating.poles) },
  };
}

/** Every check in a fixed order, judged with the profile's bands or marked not required with the reason. */
export function computeVerdicts(measured: Measured, options: JudgeOptions): Verdict[] {
  const { rating, profile } = options;
  const all = figures(measured, rating, profile);
  return CHECK_IDS.map((check): Verdict => {
    const rule = profile.checks[check];
    const figure = all[check];
    const base = { check, label: CHECK_LABELS[check], measured: figure.value, unit: figure.unit, basis: figure.basis };
    if (!rule.required) return { ...base, lower: null, upper: null, status: "not-required", reason: rule.reason, source: "" };
    if (options.checks && !options.checks.includes(check)) {
      return { ...base, lower: null, upper: null, status: "not-required", reason: `not part of the plan step${options.stepName ? ` "${options.stepName}"` : ""}`, source: describeSource(rule.source) };
    }
    const source = describeSource(rule.source);
    if (figure.expected !== undefined) {
      const status: VerdictStatus = figure.value === null ? "inconclusive" : figure.value === figure.expected ? "pass" : "fail";
      return { ...base, lower: null, upper: null, status, reason: status === "inconclusive" ? "no three-phase set to take the sequence from" : null, source, basis: `expected ${figure.expected} (A-B-C) ${figure.basis}` };
    }
    const band = figure.band as Band;
    const value = typeof figure.value === "number" ? figure.value : null;
    const status = judge(value, band);
    return { ...base, lower: band.lower, upper: band.upper, status, reason: status === "inconclusive" ? "the figure could not be computed from this capture" : null, source };
  });
}
