import { figures, type Band, type Measured } from "./figures";
import { invalidatingReasons, JUDGEMENT_WARNING_CODES } from "./invalidation";
import { levelWarning, roleWarning } from "./plausibility";
import type { Rating } from "./rating";
import type { Verdict, VerdictStatus } from "./report-schema";
import { CHECK_IDS, CHECK_LABELS, describeSource, type CheckId, type ToleranceProfile } from "./tolerance";
import type { QualityWarning } from "./types";
import { isGuardedCheck, judgeGuarded } from "./decision-rule";
import { COVERAGE_STATEMENT, evaluateUncertainty, type UncertaintyInstrument, type UncertaintySection } from "./uncertainty";

export type { Band, Measured } from "./figures";

/**
 * The order verdicts are combined in: pass < marginal < inconclusive < fail. A check that could not be
 * judged (missing, not finite, invalidated by a warning) is worse than a marginal pass because nothing
 * passes on missing evidence, and better than a measured failure because it may still pass once
 * measured again. Checks not required for the rating take no part.
 */
export const VERDICT_ORDER = ["pass", "marginal", "inconclusive", "fail"] as const;

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

export type JudgeOptions = {
  rating: Rating;
  profile: ToleranceProfile;
  /** The plan step's checks; the others are not required for this capture. All when absent. */
  checks?: readonly CheckId[];
  stepName?: string;
  /** The instruments that took the capture, for the uncertainty budgets; none recorded: "not evaluated". */
  instruments?: readonly UncertaintyInstrument[];
};

/**
 * The warnings that depend on the rating: a voltage or Ke more than `plausibilityFactor` off the
 * nameplate (scaled to the test speed as the bands are), and voltage roles that do not fit the
 * rating's phases.
 */
function ratingWarnings(measured: Measured, rating: Rating, profile: ToleranceProfile, all: ReturnType<typeof figures>): QualityWarning[] {
  const out: QualityWarning[] = [];
  const factor = profile.plausibilityFactor;
  const roles = roleWarning(measured.channels, rating, measured.threePhase !== null);
  if (roles) out.push(roles);
  const voltage = all.voltage;
  // Without a voltage figure (roles that form no set) the mean RMS of the voltage channels stands in.
  const rms = measured.channels.filter((c) => c.unit === "V").map((c) => c.rms);
  const level = typeof voltage.value === "number" ? voltage.value : rms.length > 0 ? rms.reduce((a, b) => a + b, 0) / rms.length : null;
  const v = levelWarning("implausible-voltage", "Voltage", level, voltage.nominal as number, "V", factor);
  if (v) out.push(v);
  const ke = all["back-emf-constant"];
  if (rating.ke && typeof ke.value === "number") {
    const k = levelWarning("implausible-ke", "Ke", ke.value, rating.ke.value, ke.unit, factor);
    if (k) out.push(k);
  }
  return out;
}

/**
 * Judges measured figures against a rating and profile: every check in a fixed order, judged with
 * its band or marked not required with the reason, and the warnings that depend on the rating.
 * `warnings` is the measured list with earlier rating-dependent warnings replaced by this judgement's.
 */
export function judgeMeasured(measured: Measured, options: JudgeOptions): { verdicts: Verdict[]; warnings: QualityWarning[]; uncertainty: UncertaintySection } {
  const { rating, profile } = options;
  const all = figures(measured, rating, profile);
  const uncertainty = uncertaintyOf(measured, all, options.instruments ?? []);
  const expanded = (check: CheckId): number | null => {
    const u = uncertainty.figures.find((f) => f.check === check);
    return u?.status === "evaluated" ? u.expandedUncertainty : null;
  };
  const kept = measured.warnings.filter((w) => !(JUDGEMENT_WARNING_CODES as readonly string[]).includes(w.code));
  const warnings = [...kept, ...ratingWarnings(measured, rating, profile, all)];
  const verdicts = CHECK_IDS.map((check): Verdict => {
    const rule = profile.checks[check];
    const figure = all[check];
    const base = { check, label: CHECK_LABELS[check], measured: figure.value, unit: figure.unit, basis: figure.basis, expandedUncertainty: expanded(check) };
    if (!rule.required) return { ...base, lower: null, upper: null, status: "not-required", reason: rule.reason, source: "" };
    const source = describeSource(rule.source);
    if (options.checks && !options.checks.includes(check)) {
      return { ...base, lower: null, upper: null, status: "not-required", reason: `not part of the plan step${options.stepName ? ` "${options.stepName}"` : ""}`, source };
    }
    const invalid = invalidatingReasons(warnings, check, figure.channels);
    const limits = figure.band ? { lower: figure.band.lower, upper: figure.band.upper } : { lower: null, upper: null };
    if (invalid.length > 0) return { ...base, ...limits, status: "inconclusive", reason: invalid.join(" "), source, ...(figure.expected !== undefined ? { basis: `expected ${figure.expected} (A-B-C) ${figure.basis}` } : {}) };
    if (figure.expected !== undefined) {
      const status: VerdictStatus = figure.value === null ? "inconclusive" : figure.value === figure.expected ? "pass" : "fail";
      return { ...base, lower: null, upper: null, status, reason: status === "inconclusive" ? "no three-phase set to take the sequence from" : null, source, basis: `expected ${figure.expected} (A-B-C) ${figure.basis}` };
    }
    const band = figure.band as Band;
    const value = typeof figure.value === "number" ? figure.value : null;
    if (value !== null && Number.isFinite(value) && profile.decisionRule === "guarded" && isGuardedCheck(check)) {
      return { ...base, ...limits, ...judgeGuarded(value, band, expanded(check)), source };
    }
    const status = judge(value, band);
    return { ...base, ...limits, status, reason: status === "inconclusive" ? "the figure could not be computed from this capture" : null, source };
  });
  return { verdicts, warnings, uncertainty };
}

/** Budgets for the figures as judged: voltage and frequency as shown, Ke in the rating's basis. */
function uncertaintyOf(measured: Measured, all: ReturnType<typeof figures>, instruments: readonly UncertaintyInstrument[]): UncertaintySection {
  const num = (v: number | string | null) => (typeof v === "number" ? v : null);
  const be = measured.backEmf;
  const ke = all["back-emf-constant"];
  const figuresU = evaluateUncertainty({
    voltage: { value: num(all.voltage.value), unit: all.voltage.unit, channels: all.voltage.channels },
    frequency: { value: num(all.frequency.value), unit: all.frequency.unit },
    // The line voltage behind Ke: Ke_LL,rms per krpm × n / 1000.
    ke: { value: num(ke.value), unit: ke.unit, voltageV: be ? (be.keLineRmsPerKrpm * be.speedRpm) / 1000 : null, speedRpm: be?.speedRpm ?? null, channels: ke.channels },
  }, instruments);
  return { method: "GUM (JCGM 100:2008) type B from the instruments' accuracy specifications, rectangular distributions", coverage: COVERAGE_STATEMENT, instruments: instruments.map((i) => ({ ...i, channel: i.channel ?? "" })), figures: figuresU };
}

/** Every check in a fixed order, judged with the profile's bands or marked not required with the reason. */
export function computeVerdicts(measured: Measured, options: JudgeOptions): Verdict[] {
  return judgeMeasured(measured, options).verdicts;
}
