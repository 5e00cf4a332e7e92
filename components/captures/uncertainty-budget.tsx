import type { AnalysisReport } from "@/lib/analysis";
import { describeDecisionRule } from "@/lib/analysis/decision-rule";
import { describeUncertainty, type FigureUncertainty } from "@/lib/analysis/uncertainty";
import { fmt, fmtWithUnit } from "./format";

const FIGURE_LABELS: Record<FigureUncertainty["check"], string> = { voltage: "RMS voltage", frequency: "Frequency", "back-emf-constant": "Back-EMF constant (Ke)" };

/** "± 8.3 V" beside a measured figure, for the verdicts table; nothing for checks without a budget. */
export function UncertaintyNote({ report, check }: { report: AnalysisReport; check: string }) {
  const u = report.uncertainty?.figures.find((f) => f.check === check);
  if (!u) return null;
  return <span className="block text-xs text-ink-600">{u.status === "evaluated" ? `± ${fmtWithUnit(u.expandedUncertainty, u.unit, 2)} (k = 2)` : "U not evaluated"}</span>;
}

/** Budget entries to two significant digits: enough to see each share, never more digits than U supports. */
const sig2 = (value: number, unit: string) => (Number.isFinite(value) ? `${Number(value.toPrecision(2))}${unit ? ` ${unit}` : ""}` : "—");

function Budget({ u }: { u: Extract<FigureUncertainty, { status: "evaluated" }> }) {
  return (
    <table className="mt-2 min-w-full text-xs" aria-label={`Uncertainty budget: ${FIGURE_LABELS[u.check]}`}>
      <thead className="text-left text-ink-600"><tr>
        <th className="py-1 pr-3">Contribution</th><th className="py-1 pr-3">± limit</th><th className="py-1 pr-3">Distribution</th><th className="py-1 pr-3">Divisor</th>
        <th className="py-1 pr-3">Sensitivity</th><th className="py-1 pr-3">u_i ({u.unit})</th><th className="py-1 pr-3">Share of u_c²</th>
      </tr></thead>
      <tbody className="tabular-nums">
        {u.contributions.map((c) => (
          <tr key={c.name} className="border-t border-ink-100">
            <td className="py-1 pr-3">{c.name}</td><td className="py-1 pr-3">{sig2(c.value, c.unit)}</td><td className="py-1 pr-3">{c.distribution}</td>
            <td className="py-1 pr-3">{fmt(c.divisor)}</td><td className="py-1 pr-3">{fmt(c.sensitivity)}</td><td className="py-1 pr-3">{fmt(c.standardUncertainty)}</td>
            <td className="py-1 pr-3">{(100 * c.share).toFixed(1)} %</td>
          </tr>
        ))}
        <tr className="border-t border-ink-200 font-semibold"><td className="py-1 pr-3" colSpan={5}>Combined u_c; expanded U = {u.coverageFactor}·u_c</td><td className="py-1 pr-3">{fmt(u.standardUncertainty)}</td><td className="py-1 pr-3">U = {sig2(u.expandedUncertainty, u.unit)}</td></tr>
      </tbody>
    </table>
  );
}

/** The decision rule, U of each figure with a budget, and the budgets on request. */
export function UncertaintyBudget({ report }: { report: AnalysisReport }) {
  const section = report.uncertainty;
  return (
    <section className="mt-6 rounded-lg bg-white p-5 text-sm shadow-sm ring-1 ring-ink-200" aria-labelledby="uncertainty-heading">
      <h2 id="uncertainty-heading" className="text-lg font-semibold">Measurement uncertainty</h2>
      <p className="mt-1 text-ink-700">Decision rule: {describeDecisionRule(report.decisionRule ?? "simple")}</p>
      {!section ? <p className="mt-2 text-ink-600">Not evaluated: this result was made by an engine before 2.2.0 or without a rating.</p> : (
        <>
          <p className="mt-1 text-xs text-ink-600">{section.method}; {section.coverage}.</p>
          <ul className="mt-3 space-y-3">
            {section.figures.map((u) => (
              <li key={u.check}>
                <span className="font-semibold">{FIGURE_LABELS[u.check]}</span>: {u.status === "evaluated" ? `${fmtWithUnit(u.value, u.unit)} ${describeUncertainty(u)}` : `not evaluated — ${u.reason}`}
                {u.status === "evaluated" ? (
                  <details className="mt-1">
                    <summary className="cursor-pointer text-copper-700">Show the budget</summary>
                    <Budget u={u} />
                    {u.omitted.length > 0 ? <ul className="mt-1 list-disc pl-5 text-xs text-ink-600">{u.omitted.map((o) => <li key={o}>{o}</li>)}</ul> : null}
                  </details>
                ) : null}
              </li>
            ))}
          </ul>
        </>
      )}
    </section>
  );
}
