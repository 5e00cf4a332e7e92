import { StatusTag } from "@/components/ui/status-tag";
import type { AnalysisReport } from "@/lib/analysis";
import { fmtWithUnit } from "./format";

/** Every check with its measured value, limits, status and the basis of its limits. */
export function VerdictsTable({ report }: { report: AnalysisReport }) {
  if (report.verdicts.length === 0) return <p className="text-sm text-ink-600">No checks apply: the unit&apos;s rating gives no limits for this capture.</p>;
  // Most checks share the tolerance profile's source: say it once, and only the exceptions per row.
  const counts = new Map<string, number>();
  for (const v of report.verdicts) if (v.source) counts.set(v.source, (counts.get(v.source) ?? 0) + 1);
  const common = [...counts.entries()].sort((a, b) => b[1] - a[1])[0]?.[0] ?? "";
  return (
    <>
    <div className="overflow-x-auto rounded-lg bg-white shadow-sm ring-1 ring-ink-200">
      <table className="min-w-full text-sm" aria-label="Verdicts">
        <thead className="bg-ink-100 text-left text-xs uppercase tracking-wide text-ink-600">
          <tr><th className="px-3 py-2">Check</th><th className="px-3 py-2">Measured</th><th className="px-3 py-2">Limits</th><th className="px-3 py-2">Verdict</th><th className="px-3 py-2">Basis</th></tr>
        </thead>
        <tbody>
          {report.verdicts.map((v) => (
            <tr key={v.check} className="border-t border-ink-100 align-top">
              <td className="px-3 py-2 font-semibold">{v.label}</td>
              <td className="px-3 py-2 tabular-nums">{fmtWithUnit(v.measured, v.unit)}</td>
              <td className="px-3 py-2 tabular-nums">
                {v.lower === null && v.upper === null ? "—" : `${v.lower === null ? "" : fmtWithUnit(v.lower, v.unit)} … ${v.upper === null ? "" : fmtWithUnit(v.upper, v.unit)}`}
              </td>
              <td className="px-3 py-2"><StatusTag status={v.status} /></td>
              <td className="px-3 py-2 text-xs text-ink-600">{v.basis}{v.source && v.source !== common ? <span className="block">{v.source}</span> : null}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
    {common ? <p className="mt-2 text-xs text-ink-600">Limits: {common}</p> : null}
    </>
  );
}

export function WarningsList({ report }: { report: AnalysisReport }) {
  if (report.warnings.length === 0) return null;
  return (
    <ul className="space-y-1 rounded-md border border-edge-700/40 bg-edge-100 px-4 py-3 text-sm" aria-label="Quality warnings">
      {report.warnings.map((w, i) => <li key={`${w.code}-${i}`}><span className="font-semibold">{w.code}</span>: {w.message}</li>)}
    </ul>
  );
}
