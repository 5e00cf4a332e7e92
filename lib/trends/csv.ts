import type { TrendBand } from "./band";
import type { TrendPoint } from "./types";

// The trend's CSV: one row per plotted point, in the order drawn, so the file and the chart agree.

const cell = (v: string | number | null) => {
  if (typeof v === "number") return String(v);
  const s = v ?? "";
  // Quotes for separators, and for text a spreadsheet would run as a formula.
  return /[",\n\r]/.test(s) || /^[=+\-@\t]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
};

export const TREND_CSV_HEADER = ["serial", "measured_at", "value", "unit", "in_statistics", "status", "rules", "test_kind", "bench", "expanded_uncertainty", "capture_id"];

export function renderTrendCsv(view: { points: readonly TrendPoint[]; band: TrendBand | null }): string {
  const unit = view.band?.unit ?? "";
  const lines = [TREND_CSV_HEADER.join(",")];
  for (const p of view.points) {
    lines.push([p.serial, p.measuredAt, p.value, unit, p.flagged ? "no" : "yes", p.status, p.rules.join(" "), p.testKind, p.bench, p.expandedUncertainty, p.captureId].map(cell).join(","));
  }
  return `${lines.join("\r\n")}\r\n`;
}
