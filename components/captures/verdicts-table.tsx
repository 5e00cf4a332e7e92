import { StatusTag } from "@/components/ui/status-tag";
import type { AnalysisReport } from "@/lib/analysis";
import { formatFigureWithUnit, quantityFor } from "@/lib/verdicts/format-figure";
import { marginOf } from "@/lib/verdicts/margin";

const figure = (value: number | string | null, unit: string, check: string) =>
  typeof value === "string" ? value : formatFigureWithUnit(value, unit, { quantity: quantityFor(unit, check) });

/** Every judged check with its measured value, limits, verdict, basis and the limit's source; then the checks not required, with why. */
export function VerdictsTable({ report }: { report: AnalysisReport }) {
  if (report.verdicts.length === 0) return <p className="text-sm text-ink-600">Nothing was judged: the capture was analysed without a rating. Its result is inconclusive.</p>;
  const judged = report.verdicts.filter((v) => v.status !== "not-required");
  const skipped = report.verdicts.filter((v) => v.status === "not-required");
  return (
    <>
    <div className="overflow-x-auto rounded-lg bg-white shadow-sm ring-1 ring-ink-200">
      <table className="min-w-full text-sm" aria-label="Verdicts">
        <thead className="bg-ink-100 text-left text-xs uppercase tracking-wide text-ink-600">
          <tr><th className="sticky left-0 z-10 bg-ink-100 px-3 py-2">Verdict</th><th className="px-3 py-2">Check</th><th className="px-3 py-2">Measured</th><th className="px-3 py-2">Limits</th><th className="px-3 py-2">Margin</th><th className="px-3 py-2">Basis and source</th></tr>
        </thead>
        <tbody>
          {judged.map((v) => (
            <tr key={v.check} className="border-t border-ink-100 align-top">
              <td className="sticky left-0 z-10 bg-white px-3 py-2" data-testid="verdict-cell"><StatusTag status={v.status} /></td>
              <td className="px-3 py-2 font-semibold">{v.label}</td>
              <td className="whitespace-nowrap px-3 py-2 tabular-nums">{figure(v.measured, v.unit, v.check)}</td>
              <td className="whitespace-nowrap px-3 py-2 tabular-nums">
                {v.lower === null && v.upper === null ? "—" : `${v.lower === null ? "" : figure(v.lower, v.unit, v.check)} … ${v.upper === null ? "" : figure(v.upper, v.unit, v.check)}`}
              </td>
              <td className="px-3 py-2 text-xs tabular-nums">{v.status === "inconclusive" ? "—" : marginOf(v)?.words ?? "—"}</td>
              <td className="px-3 py-2 text-xs text-ink-600">
                {v.basis}
                {v.source ? <span className="block">Limit: {v.source}</span> : null}
                {v.reason ? <span className="block font-semibold text-ink-800">{v.reason}</span> : null}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
    {skipped.length > 0 ? (
      <details className="mt-2 text-xs text-ink-600">
        <summary className="cursor-pointer">Not required here ({skipped.length})</summary>
        <ul className="mt-1 list-disc pl-5">{skipped.map((v) => <li key={v.check}><span className="font-semibold">{v.label}</span>: {v.reason ?? "not required"}</li>)}</ul>
      </details>
    ) : null}
    </>
  );
}

/** Capture-quality warnings as sentences; alerts (an implausible reading, roles that do not fit the rating) first and prominent. */
export function WarningsList({ report }: { report: AnalysisReport }) {
  if (report.warnings.length === 0) return null;
  const alerts = report.warnings.filter((w) => w.level === "alert");
  const rest = report.warnings.filter((w) => w.level !== "alert");
  return (
    <>
      {alerts.length > 0 ? (
        <div role="alert" className="rounded-md border-2 border-outside-700 bg-outside-100 px-4 py-3 text-sm text-outside-700" aria-label="Implausible readings">
          <p className="font-semibold">Check the set-up before relying on this capture</p>
          <ul className="mt-1 list-disc pl-5">{alerts.map((w, i) => <li key={`${w.code}-${i}`}>{w.message}</li>)}</ul>
        </div>
      ) : null}
      {rest.length > 0 ? (
        <ul className="space-y-1 rounded-md border border-edge-700/40 bg-edge-100 px-4 py-3 text-sm" aria-label="Quality warnings">
          {rest.map((w, i) => <li key={`${w.code}-${i}`}>{w.message}</li>)}
        </ul>
      ) : null}
    </>
  );
}
