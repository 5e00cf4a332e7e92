import type { VerdictStatus } from "@/lib/analysis";
import Link from "next/link";
import { StatusTag } from "@/components/ui/status-tag";
import { TEST_KIND_LABELS } from "@/lib/captures/input-schemas";
import { CaptureStateBadge } from "./capture-state-badge";
import { CaptureFigureCells } from "./capture-figure-cells";
import { RefreshWhileBusy } from "./refresh-while-busy";

type Row = {
  id: string; testKind: string; state: "uploading" | "queued" | "analysing" | "analysed" | "rejected" | "failed"; stateMessage: string | null;
  originalName: string; createdAt: string; overall: VerdictStatus | null;
  frequencyHz: number | null; worstThdPercent: number | null; vufPercent: number | null; keLineRmsPerKrpm: number | null;
};

/** A unit's captures, newest first, with state, verdict and the headline numbers. */
export function UnitCapturesTable({ rows }: { rows: Row[] }) {
  if (rows.length === 0) return <p className="text-sm text-ink-600">No captures yet.</p>;
  return (
    <div className="overflow-x-auto">
      <RefreshWhileBusy states={rows.map((r) => r.state)} />
      <table className="min-w-full text-sm" aria-label="Captures">
        <thead className="text-left text-xs uppercase tracking-wide text-ink-600">
          <tr>
            <th className="sticky left-0 z-10 bg-white py-1 pr-4">Verdict</th>
            <th className="py-1 pr-4">Captured (UTC)</th><th className="py-1 pr-4">Test</th><th className="py-1 pr-4">File</th><th className="py-1 pr-4">State</th>
            <th className="py-1 pr-4">f (Hz)</th><th className="py-1 pr-4">THD (%)</th><th className="py-1 pr-4">VUF (%)</th><th className="py-1">Ke (V/krpm)</th>
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => (
            <tr key={r.id} className="border-t border-ink-100 align-top">
              <td className="sticky left-0 z-10 bg-white py-1.5 pr-4" data-testid="verdict-cell">{r.state === "analysed" ? <StatusTag status={r.overall} /> : "—"}</td>
              <td className="whitespace-nowrap py-1.5 pr-4 tabular-nums">{r.createdAt.slice(0, 16).replace("T", " ")}</td>
              <td className="py-1.5 pr-4">{TEST_KIND_LABELS[r.testKind as keyof typeof TEST_KIND_LABELS] ?? r.testKind}</td>
              <td className="py-1.5 pr-4 font-mono"><Link href={`/captures/${r.id}`}>{r.originalName}</Link></td>
              <td className="py-1.5 pr-4" title={r.stateMessage ?? undefined}><CaptureStateBadge state={r.state} /></td>
              <CaptureFigureCells row={r} cellClass="py-1.5 pr-4" />
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
