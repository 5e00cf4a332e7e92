import { csvLine } from "./csv-cell";
import type { ReportContent } from "./content";
import { verdictWord } from "@/lib/verdicts/words";

// The CSV of a released report: one row per check of each step of record, read from the stored
// content (the facts the PDF was drawn from), with the report's number, revision, status and the
// unit's disposition on every row. Pure: the portal, the API and the lab's per-unit CSV all use it.

export const REPORT_CSV_COLUMNS = [
  "report_number", "revision", "report_status", "disposition", "serial", "model", "step", "test_kind", "capture_file", "capture_sha256",
  "captured_at_utc", "speed_rpm", "check", "label", "order", "measured", "unit", "lower", "upper", "limit", "verdict",
  "expanded_uncertainty_k2", "source", "verdict_word",
] as const;

export type ReportCsvStatus = "valid" | "superseded" | "withdrawn";

export function renderReportCsv(content: ReportContent, status: ReportCsvStatus): string {
  const lines = [csvLine(REPORT_CSV_COLUMNS)];
  for (const step of content.steps) {
    for (const c of step.checks) {
      lines.push(csvLine([
        content.number, content.revision, status, content.disposition, content.unit.serial, content.unit.modelCode, step.name, step.testKind,
        step.capture?.fileName, step.capture?.sha256, step.capture?.capturedAt, step.capture?.speedRpm, c.checkId, c.label, c.order, c.value,
        c.unit, c.lower, c.upper, c.limit, c.verdict, c.expandedUncertainty, c.source, verdictWord(c.verdict),
      ]));
    }
  }
  return `${lines.join("\r\n")}\r\n`;
}

/** The download name of a report file; a revision that is no longer valid says so in its name. */
export function reportFileName(r: { number: string; revision: number; serial: string; status: ReportCsvStatus }, ext: "pdf" | "csv"): string {
  const safe = (s: string) => s.replace(/[^A-Za-z0-9._-]+/g, "_");
  const mark = r.status === "valid" ? "" : `-${r.status.toUpperCase()}`;
  return `${safe(r.number)}-rev${r.revision}-${safe(r.serial)}${mark}.${ext}`;
}
