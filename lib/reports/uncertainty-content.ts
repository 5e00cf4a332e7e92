import { COVERAGE_STATEMENT, describeDecisionRule, type AnalysisReport, type DecisionRule } from "@/lib/analysis";

// What a released report states about uncertainty and the decision rule, read from the stored
// analysis report, so the report, the capture page and the API word them alike.

/** A check's expanded uncertainty (k = 2) in the check's unit, or null when not evaluated (never 0 for "unknown"). */
export function expandedUncertaintyOf(report: AnalysisReport, checkId: string): number | null {
  return report.verdicts.find((v) => v.check === checkId)?.expandedUncertainty ?? null;
}

/** The decision rule the verdicts follow, in words (reports before engine 2.2.0: simple acceptance). */
export function decisionRuleStatement(rule: DecisionRule | undefined): string {
  return describeDecisionRule(rule ?? "simple");
}

/** One sentence for the report's uncertainty statement. */
export function uncertaintyStatementOf(report: AnalysisReport): string {
  const figures = report.uncertainty?.figures ?? [];
  const evaluated = figures.filter((f) => f.status === "evaluated").map((f) => f.check);
  if (evaluated.length === 0) return "Measurement uncertainty was not evaluated for this capture (no instrument accuracy on record); figures are reported without it.";
  return `Expanded uncertainties (${COVERAGE_STATEMENT}) are evaluated by GUM type B from the instruments' accuracy specifications for ${evaluated.join(", ")}; other figures are reported without an uncertainty.`;
}
