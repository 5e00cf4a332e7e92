import type { UnitRecord } from "@/lib/dal/unit-report";
import { csvCell as cell } from "@/lib/reports/csv-cell";
import { verdictWord } from "@/lib/verdicts/words";

const COLUMNS = ["serial", "model", "capture_id", "captured_at_utc", "test_kind", "speed_rpm", "analysis_version", "check", "label", "measured", "unit", "lower", "upper", "status", "basis", "verdict_word"] as const;

/** One row per verdict of every current analysis: the machine-readable twin of the PDF record. */
export function renderUnitCsv(record: UnitRecord): string {
  const lines = [COLUMNS.join(",")];
  for (const c of record.captures) {
    for (const v of c.report.verdicts) {
      lines.push([
        record.serial, record.modelCode, c.captureId, c.createdAt.toISOString(), c.testKind, c.speedRpm, c.analysisVersion,
        v.check, v.label, v.measured, v.unit, v.lower, v.upper, v.status, v.basis, verdictWord(v.status),
      ].map(cell).join(","));
    }
  }
  return `${lines.join("\r\n")}\r\n`;
}
