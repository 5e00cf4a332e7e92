import type { AnalysisReport, VerdictStatus } from "@/lib/analysis";
import { invalidatedChecks } from "@/lib/analysis/invalidation";

// The per-figure rows trends are computed from (table analysis_figures): one per numeric check of a
// report and one per single harmonic order. Pure, so the worker, re-judging and the backfill agree.

/** Harmonic orders kept per analysis: enough for any single-order trend a profile judges. */
export const MAX_TREND_HARMONIC = 50;
/** Figure id of a single-harmonic row; its order is in harmonic_order. */
export const HARMONIC_FIGURE = "harmonic";

export type FigureRow = { figure: string; harmonicOrder: number; value: number | null; status: VerdictStatus | null; flagged: boolean; expandedUncertainty: number | null };

/**
 * Flagged: the capture cannot stand as evidence of the machine, so none of its figures enter the
 * statistics. Its check was inconclusive or its figure missing, or the capture carries a warning that
 * invalidates checks (clipped, too few cycles, under-sampled) or a plausibility alert (a probe ratio
 * or unit that makes it wrongly scaled). A clipped record's RMS is low too, though only the distortion
 * checks are invalidated by the engine; the trend leaves the whole capture out.
 */
function isFlagged(report: AnalysisReport, status: VerdictStatus | null, value: number | null): boolean {
  if (value === null || status === "inconclusive") return true;
  return report.warnings.some((w) => w.level === "alert" || invalidatedChecks(w).length > 0);
}

/** Voltage channels whose waveform the distortion checks read: line-line when present (figures.ts does the same). */
function waveformChannels(report: AnalysisReport) {
  const voltages = report.channels.filter((c) => c.unit === "V");
  const lines = voltages.filter((c) => ["vab", "vbc", "vca"].includes(c.role));
  return lines.length > 0 ? lines : voltages;
}

export function figureRowsOf(report: AnalysisReport): FigureRow[] {
  const rows: FigureRow[] = [];
  for (const v of report.verdicts) {
    if (typeof v.measured === "string") continue; // phase sequence: a word, not a trend
    const value = typeof v.measured === "number" && Number.isFinite(v.measured) ? v.measured : null;
    const expandedUncertainty = typeof v.expandedUncertainty === "number" && Number.isFinite(v.expandedUncertainty) ? v.expandedUncertainty : null;
    rows.push({ figure: v.check, harmonicOrder: 0, value, status: v.status, flagged: isFlagged(report, v.status, value), expandedUncertainty });
  }
  const single = report.verdicts.find((v) => v.check === "individual-harmonic");
  const channels = waveformChannels(report);
  const orders = new Set(channels.flatMap((c) => c.harmonics.map((h) => h.order)).filter((o) => o >= 2 && o <= MAX_TREND_HARMONIC));
  for (const order of [...orders].sort((a, b) => a - b)) {
    // Worst voltage channel, percent of its fundamental, as the largest-harmonic check takes it.
    const percents = channels.flatMap((c) => {
      const h = c.harmonics.find((x) => x.order === order);
      return h && c.fundamental.rms > 0 ? [(100 * h.rms) / c.fundamental.rms] : [];
    });
    const value = percents.length > 0 ? Math.max(...percents) : null;
    // The engine judges the largest order only; a single order carries the check's status when that
    // says the whole spectrum is unusable or not asked for, else none.
    const status: VerdictStatus | null = single && (single.status === "inconclusive" || single.status === "not-required") ? single.status : null;
    rows.push({ figure: HARMONIC_FIGURE, harmonicOrder: order, value, status, flagged: isFlagged(report, status, value), expandedUncertainty: null });
  }
  return rows;
}
