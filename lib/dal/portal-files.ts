import "server-only";
import { Readable } from "node:stream";
import yazl from "yazl";
import type { PortalReportRow } from "@/db/queries/portal";
import { HttpError } from "@/lib/auth/guards";
import { reportContentSchema } from "@/lib/reports/content";
import { renderReportCsv, reportFileName } from "@/lib/reports/report-csv";
import { readReportPdf, sha256Hex } from "@/lib/server/report-store";

// The files of a released report as a client downloads them: the stored PDF bytes (checked against
// the recorded sha256), the CSV drawn from the stored content, or a selection as a streamed zip.

export const ZIP_MAX_REPORTS = 25;
export const ZIP_MAX_BYTES = 100 * 1024 * 1024;

/** A revision that is no longer valid says so in its headers as well as in its file name. */
function reportHeaders(row: PortalReportRow, type: string, name: string): Record<string, string> {
  return {
    "content-type": type, "content-disposition": `attachment; filename="${name}"`, "cache-control": "private, no-store",
    "x-report-number": row.number, "x-report-revision": String(row.revision), "x-report-status": row.status,
  };
}

export async function verifiedPdfBytes(row: PortalReportRow): Promise<Uint8Array> {
  let bytes: Uint8Array;
  try {
    bytes = await readReportPdf(row.objectKey);
  } catch {
    throw new HttpError(503, `The file of report ${row.number} revision ${row.revision} cannot be read right now: try again in a few minutes.`);
  }
  if (sha256Hex(bytes) !== row.sha256) {
    console.error(`report ${row.id}: stored PDF does not match its recorded sha256`);
    throw new HttpError(500, `The stored file of report ${row.number} revision ${row.revision} does not match its recorded checksum, so it is not served: the lab has to look at it.`);
  }
  return bytes;
}

export function reportCsvText(row: PortalReportRow): string {
  const content = reportContentSchema.safeParse(row.content);
  if (!content.success) throw new HttpError(500, `The stored results of report ${row.number} revision ${row.revision} cannot be read: the lab has to look at it.`);
  return renderReportCsv(content.data, row.status);
}

export async function pdfResponse(row: PortalReportRow): Promise<Response> {
  const bytes = await verifiedPdfBytes(row);
  return new Response(Buffer.from(bytes), {
    headers: { ...reportHeaders(row, "application/pdf", reportFileName(row, "pdf")), "content-length": String(bytes.byteLength), etag: `"${row.sha256}"` },
  });
}

export function csvResponse(row: PortalReportRow): Response {
  return new Response(reportCsvText(row), { headers: reportHeaders(row, "text/csv; charset=utf-8", reportFileName(row, "csv")) });
}

/** Refuses a selection over the caps before anything is read. */
export function checkZipCaps(rows: readonly PortalReportRow[]): void {
  if (rows.length === 0) throw new HttpError(400, "Select at least one report to download.");
  if (rows.length > ZIP_MAX_REPORTS) throw new HttpError(413, `A zip holds at most ${ZIP_MAX_REPORTS} reports; you selected ${rows.length}. Download the rest in another zip.`);
  const bytes = rows.reduce((sum, r) => sum + r.sizeBytes, 0);
  if (bytes > ZIP_MAX_BYTES) {
    throw new HttpError(413, `The selected reports add up to ${(bytes / 1048576).toFixed(1)} MiB, over the ${ZIP_MAX_BYTES / 1048576} MiB a zip may hold: select fewer.`);
  }
}

/**
 * A zip streamed as it is written: each PDF is read (and checked) only when the archive reaches it, so
 * at most one report's bytes are in memory. A checksum mismatch ends the stream with an error.
 */
export function zipResponse(rows: readonly PortalReportRow[], name: string): Response {
  checkZipCaps(rows);
  const zip = new yazl.ZipFile();
  for (const row of rows) {
    const lazy = Readable.from((async function* () {
      yield Buffer.from(await verifiedPdfBytes(row));
    })());
    zip.addReadStream(lazy, reportFileName(row, "pdf"), { compress: false, mtime: row.releasedAt });
    zip.addBuffer(Buffer.from(reportCsvText(row), "utf8"), reportFileName(row, "csv"), { mtime: row.releasedAt });
  }
  zip.end();
  const body = Readable.toWeb(zip.outputStream as Readable) as ReadableStream<Uint8Array>;
  return new Response(body, {
    headers: { "content-type": "application/zip", "content-disposition": `attachment; filename="${name}"`, "cache-control": "private, no-store" },
  });
}
