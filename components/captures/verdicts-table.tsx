import { StatusTag } from "@/components/ui/status-tag";
import type { AnalysisReport } from "@/lib/analysis";
import { fmtWithUnit } from "./format";

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
          <tr><th className="sticky left-0 bg-ink-100 px-3 py-2">Check</th><th className="px-3 py-2">Verdict</th><th className="px-3 py-2">Measured</th><th className="px-3 py-2">Limits</th><th className="px-3 py-2">Basis and source</th></tr>
        </thead>
        <tbody>
          {judged.map((v) => (
            <tr key={v.check} className="border-t border-ink-100 align-top">
              <td className="sticky left-0 bg-white px-3 py-2 font-semibold">{v.label}</td>
              <td className="px-3 py-2"><StatusTag status={v.status} /></td>
              <td className="px-3 py-2 tabular-nums">{fmtWithUnit(v.measured, v.unit)}</td>
              <td className="px-3 py-2 tabular-nums">
                {v.lower === null && v.upper === null ? "—" : `${v.lower === null ? "" : fmtWithUnit(v.lower, v.unit)} … ${v.upper === null ? "" : fmtWithUnit(v.upper, v.unit)}`}
              </td>
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

export function WarningsList({ report }: { report: AnalysisReport }) {
  if (report.warnings.length === 0) return null;
  return (
    <ul className="space-y-1 rounded-md border border-edge-700/40 bg-edge-100 px-4 py-3 text-sm" aria-label="Quality warnings">
      {report.warnings.map((w, i) => <li key={`${w.code}-${i}`}>{w.message}</li>)}
    </ul>
  );
}
