import Link from "next/link";
import { CaptureStateBadge } from "@/components/captures/capture-state-badge";
import { CaptureFigureCells } from "@/components/captures/capture-figure-cells";
import { StatusTag } from "@/components/ui/status-tag";
import { TEST_KIND_LABELS } from "@/lib/captures/input-schemas";
import type { CaptureListQuery, CaptureSort } from "@/lib/captures/list-query";
import type { getCaptureListView } from "@/lib/dal/capture-list";

type Rows = Awaited<ReturnType<typeof getCaptureListView>>["rows"];
export type ListLink = (overrides: Partial<Record<keyof CaptureListQuery, string | number | undefined>>) => string;

/** A column header that sorts by its figure; a second click reverses the order. */
function SortHeader({ label, sort, query, link }: { label: string; sort: CaptureSort; query: CaptureListQuery; link: ListLink }) {
  const active = query.sort === sort;
  const nextDir = active && query.dir === "desc" ? "asc" : "desc";
  return (
    <th className="px-3 py-2" aria-sort={active ? (query.dir === "asc" ? "ascending" : "descending") : undefined}>
      <Link href={link({ sort, dir: nextDir, page: 1, after: undefined, before: undefined })} className="text-ink-600 no-underline hover:underline">
        {label}{active ? (query.dir === "asc" ? " ↑" : " ↓") : ""}
      </Link>
    </th>
  );
}

export function CaptureListTable({ rows, query, link }: { rows: Rows; query: CaptureListQuery; link: ListLink }) {
  const head = (label: string, sort: CaptureSort) => <SortHeader label={label} sort={sort} query={query} link={link} />;
  return (
    <div className="overflow-x-auto rounded-lg bg-white shadow-sm ring-1 ring-ink-200">
      <table className="min-w-full text-sm" aria-label="Captures">
        <thead className="bg-ink-100 text-left text-xs uppercase tracking-wide text-ink-600">
          <tr>
            <th className="sticky left-0 z-10 bg-ink-100 px-3 py-2">Verdict</th>
            {head("Captured (UTC)", "captured")}
            <th className="px-3 py-2">Unit</th><th className="px-3 py-2">Test</th><th className="px-3 py-2">File</th>
            <th className="px-3 py-2">State</th>
            {head("f (Hz)", "frequency")}{head("THD (%)", "thd")}{head("VUF (%)", "vuf")}{head("Ke (V/krpm)", "ke")}
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => (
            <tr key={r.id} className="border-t border-ink-100 align-top">
              <td className="sticky left-0 z-10 bg-white px-3 py-2" data-testid="verdict-cell">{r.state === "analysed" ? <StatusTag status={r.overall} /> : "—"}</td>
              <td className="whitespace-nowrap px-3 py-2 tabular-nums">{r.createdAt.slice(0, 16).replace("T", " ")}</td>
              <td className="px-3 py-2 font-mono"><Link href={`/units/${r.unitId}`}>{r.serial}</Link></td>
              <td className="px-3 py-2">{TEST_KIND_LABELS[r.testKind as keyof typeof TEST_KIND_LABELS] ?? r.testKind}</td>
              <td className="px-3 py-2 font-mono"><Link href={`/captures/${r.id}`}>{r.originalName}</Link></td>
              <td className="px-3 py-2" title={r.stateMessage ?? undefined}><CaptureStateBadge state={r.state} progress={r.progress} /></td>
              <CaptureFigureCells row={r} cellClass="px-3 py-2" />
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
