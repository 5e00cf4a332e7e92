import type { PortalListItem } from "@/lib/dal/portal";

const STATUS = {
  valid: { word: "Valid", cls: "bg-within-100 text-within-700", mark: "●" },
  superseded: { word: "Superseded — not valid", cls: "bg-edge-100 text-edge-700", mark: "◆" },
  withdrawn: { word: "Withdrawn — not valid", cls: "bg-outside-100 text-outside-700", mark: "▲" },
} as const;

export function ReportRow({ report: r }: { report: PortalListItem }) {
  const s = STATUS[r.status];
  return (
    <tr className="border-t border-ink-100" data-testid={`report-${r.number}-rev${r.revision}`}>
      <td className="px-3 py-2"><input type="checkbox" name="ids" value={r.id} aria-label={`Select ${r.number} revision ${r.revision}`} /></td>
      <td className="px-3 py-2 font-semibold">{r.number} rev {r.revision}</td>
      <td className="px-3 py-2">{r.serial}</td>
      <td className="px-3 py-2">{r.modelCode}</td>
      <td className="px-3 py-2">{r.releasedAt.toISOString().slice(0, 10)} · {r.labName}</td>
      <td className="px-3 py-2">
        <span className={`inline-flex items-center gap-1 rounded px-2 py-0.5 text-xs font-semibold ${s.cls}`}><span aria-hidden>{s.mark}</span>{s.word}</span>
      </td>
      <td className="space-x-3 px-3 py-2">
        <a href={`/api/portal/reports/${r.id}/pdf`} className="font-semibold text-copper-700 underline">PDF<span className="sr-only"> of {r.number} revision {r.revision}</span></a>
        <a href={`/api/portal/reports/${r.id}/csv`} className="font-semibold text-copper-700 underline">CSV<span className="sr-only"> of {r.number} revision {r.revision}</span></a>
      </td>
    </tr>
  );
}
