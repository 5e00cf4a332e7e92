import type { ReactNode } from "react";
import { ATTACHMENT_KIND_LABELS, downloadNameFor, formatBytes, isImageType } from "@/lib/attachments/rules";

export type AttachmentRow = {
  id: string; kind: keyof typeof ATTACHMENT_KIND_LABELS; caption: string; originalName: string;
  contentType: string; sizeBytes: number; createdAt: Date; uploadedBy: string;
};

const when = (d: Date) => `${d.toISOString().replace("T", " ").slice(0, 16)} UTC`;

function Thumbnail({ row }: { row: AttachmentRow }) {
  if (!isImageType(row.contentType)) {
    return <span aria-hidden className="flex h-16 w-16 shrink-0 items-center justify-center rounded bg-ink-100 text-xs font-bold text-ink-600">PDF</span>;
  }
  // A plain img: the file comes from the guarded handler with the session cookie, which the image
  // optimiser would not send.
  // eslint-disable-next-line @next/next/no-img-element
  return <img src={`/api/attachments/${row.id}?disposition=inline`} alt="" loading="lazy" className="h-16 w-16 shrink-0 rounded object-cover ring-1 ring-ink-200" />;
}

/** The files attached to a unit, newest first; `actions` adds controls per row (e.g. removal). */
export function AttachmentList({ rows, actions }: { rows: AttachmentRow[]; actions?: (row: AttachmentRow) => ReactNode }) {
  if (rows.length === 0) return <p className="text-sm text-ink-600">No files attached yet.</p>;
  return (
    <ul className="divide-y divide-ink-100" aria-label="Attached files">
      {rows.map((row) => (
        <li key={row.id} className="flex items-start gap-4 py-3 text-sm" aria-label={row.originalName}>
          <Thumbnail row={row} />
          <div className="min-w-0 flex-1">
            <p className="truncate font-semibold text-ink-900">{row.originalName}</p>
            <p className="text-xs text-ink-600">
              {ATTACHMENT_KIND_LABELS[row.kind]} · {formatBytes(row.sizeBytes)} · {row.uploadedBy}, {when(row.createdAt)}
            </p>
            {row.caption ? <p className="mt-1 text-ink-800">{row.caption}</p> : null}
          </div>
          <div className="flex shrink-0 items-center gap-2">
            <a href={`/api/attachments/${row.id}`} download={downloadNameFor(row.originalName, row.contentType)} className="rounded-md bg-white px-3 py-1.5 text-xs font-semibold no-underline ring-1 ring-ink-200 hover:bg-ink-100">
              Download<span className="sr-only"> {row.originalName}</span>
            </a>
            {actions?.(row)}
          </div>
        </li>
      ))}
    </ul>
  );
}
