import { IMPLAUSIBLE_LEVEL_INVALIDATES, ROLE_MISMATCH_INVALIDATES } from "./invalidation";
import type { Rating } from "./rating";
import type { ChannelReport } from "./report-schema";
import type { QualityWarning } from "./types";

const fmt = (v: number) => (Math.abs(v) >= 100 ? v.toFixed(0) : v.toPrecision(3));

/**
 * The likely cause of a reading `ratio` times the expected one. Near a power of ten (within ±25 %)
 * the usual culprits are a probe ratio (10:1, 100:1, 1000:1) or a unit prefix (mV taken as V) [CP].
 */
export function likelyCause(ratio: number): string {
  const decades = Math.log10(ratio);
  const nearest = Math.round(decades);
  const nearDecade = nearest !== 0 && Math.abs(ratio / 10 ** nearest - 1) <= 0.25;
  if (!nearDecade) return ratio < 1 ? "check the channel roles, the probe ratio and the units" : "check the channel roles, the probe ratio (applied twice?) and the units";
  const times = 10 ** Math.abs(nearest);
  if (ratio < 1) return times >= 1000 ? `about ×${times} low: a probe ratio not applied, or values in mV read as V?` : `about ×${times} low: a probe ratio not applied?`;
  return times >= 1000 ? `about ×${times} high: values in V read as mV, or a probe ratio applied twice?` : `about ×${times} high: a probe ratio applied twice, or one that the instrument had already applied?`;
}

/**
 * A measured level `factor` or more times off the nameplate (scaled to the test speed) is not a
 * machine out of tolerance but a setup mistake, most often the probe ratio; the checks that scale
 * with it are inconclusive until it is corrected.
 */
export function levelWarning(code: "implausible-voltage" | "implausible-ke", what: string, measured: number | null, expected: number, unit: string, factor: number): QualityWarning | null {
  if (measured === null || !Number.isFinite(measured) || !(expected > 0)) return null;
  const ratio = Math.abs(measured) / expected;
  if (ratio > 1 / factor && ratio < factor) return null;
  return {
    code,
    level: "alert",
    message: `${what} reads ${fmt(measured)} ${unit} against ${fmt(expected)} ${unit} rated: ${ratio === 0 ? "no signal at all, check the channel roles and probe" : likelyCause(ratio)} (${factor}× or more off, so not judged)`,
    invalidates: [...IMPLAUSIBLE_LEVEL_INVALIDATES],
  };
}

const PHASE_SET = ["van", "vbn", "vcn", "vab", "vbc", "vca"];

/** Voltage channel roles that cannot describe the rating's phases (single voltages on a three-phase rating, a set on a single-phase one). */
export function roleWarning(channels: readonly Pick<ChannelReport, "id" | "role" | "unit">[], rating: Pick<Rating, "phases">, hasPhaseSet: boolean): QualityWarning | null {
  const voltages = channels.filter((c) => c.unit === "V");
  if (voltages.length === 0) return null;
  const list = voltages.map((c) => `"${c.id}" as ${c.role}`).join(", ");
  if (rating.phases === 3 && !hasPhaseSet) {
    return {
      code: "roles-do-not-fit-rating",
      level: "alert",
      message: `The rating is three-phase but the voltage channels (${list}) do not form a phase set: give them line-line roles (vab, vbc, vca) or line-neutral roles (van, vbn, vcn) — voltage, Ke and the phase-set checks are not judged until then`,
      invalidates: [...ROLE_MISMATCH_INVALIDATES],
    };
  }
  if (rating.phases === 1 && voltages.filter((c) => PHASE_SET.includes(c.role)).length >= 2) {
    return {
      code: "roles-do-not-fit-rating",
      level: "alert",
      message: `The rating is single-phase but the voltage channels (${list}) are set as a phase set: give the winding's channel the role v — voltage and Ke are not judged until then`,
      invalidates: [...ROLE_MISMATCH_INVALIDATES],
    };
  }
  return null;
}
