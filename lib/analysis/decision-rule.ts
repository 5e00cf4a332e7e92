import { z } from "zod";
import type { Band } from "./figures";
import type { VerdictStatus } from "./report-schema";
import { UNCERTAINTY_FIGURES } from "./uncertainty";

/**
 * How a measured value and its expanded uncertainty U become a verdict (ISO/IEC 17025:2017 7.8.6,
 * ILAC-G8:09/2019):
 * - "simple": simple acceptance (shared risk). Inside the band (limits inclusive) passes; "marginal"
 *   is the profile's marginal zone near a limit. U is stated beside the figure but does not move the verdict.
 * - "guarded": guarded acceptance with a guard band w = U. For a figure whose U is evaluated, the
 *   acceptance limits are lower + U and upper − U: a value at or inside them passes; a value inside
 *   the band but beyond them (within U of a limit, the limit itself included) is "marginal"; outside
 *   the band fails. When U is not evaluated nothing is accepted on that figure: inside the band it is
 *   inconclusive. Figures the engine draws no budget for are judged by simple acceptance.
 */
export const DECISION_RULES = ["simple", "guarded"] as const;
export type DecisionRule = (typeof DECISION_RULES)[number];
export const decisionRuleSchema = z.enum(DECISION_RULES, { error: "Choose simple acceptance or guarded acceptance" });

/** Whether the rule's guard band reaches a check (only checks with a budget). */
export function isGuardedCheck(check: string): boolean {
  return (UNCERTAINTY_FIGURES as readonly string[]).includes(check);
}

/** The rule in words, for the profile editor, the capture page and the released report. */
export function describeDecisionRule(rule: DecisionRule): string {
  if (rule === "guarded") {
    return "Guarded acceptance (ILAC-G8:09/2019, guard band w = U, k = 2): voltage, frequency and Ke pass only when at least U inside each limit; within U of a limit they are marginal, outside the limits they fail, and without an evaluated uncertainty they are inconclusive. Other checks use simple acceptance.";
  }
  return "Simple acceptance (ILAC-G8:09/2019, shared risk): a value inside the limits, limits included, passes; the expanded uncertainty (k = 2) is stated beside each figure but does not move the verdict.";
}

/**
 * The guarded verdict of a finite value against a band with expanded uncertainty `u` (≥ 0), or with
 * `u` null (not evaluated). See DECISION_RULES for the exact edges.
 */
export function judgeGuarded(measured: number, band: Band, u: number | null): { status: VerdictStatus; reason: string | null } {
  const { lower, upper } = band;
  if ((lower !== null && measured < lower) || (upper !== null && measured > upper)) return { status: "fail", reason: null };
  if (u === null) return { status: "inconclusive", reason: "guarded acceptance needs the expanded uncertainty, which was not evaluated for this capture (record its instruments)" };
  if ((upper !== null && measured > upper - u) || (lower !== null && measured < lower + u)) {
    return { status: "marginal", reason: `within the expanded uncertainty (± ${Number(u.toPrecision(2))}) of a limit: not accepted under guarded acceptance` };
  }
  return { status: "pass", reason: null };
}
