import { CALIBRATION_STATUS_LABELS, type CalibrationStatus } from "@/lib/instruments/status";

// A word and a mark, never colour alone.
const STYLES: Record<CalibrationStatus, { cls: string; mark: string }> = {
  "in-date": { cls: "bg-within-100 text-within-700", mark: "●" },
  "due-soon": { cls: "bg-edge-100 text-edge-700", mark: "◆" },
  overdue: { cls: "bg-outside-100 text-outside-700", mark: "▲" },
  retired: { cls: "bg-ink-100 text-ink-600", mark: "–" },
  "no-due-date": { cls: "bg-ink-100 text-ink-900 ring-1 ring-ink-600", mark: "?" },
};

export function CalibrationTag({ status }: { status: CalibrationStatus }) {
  const s = STYLES[status];
  return (
    <span className={`inline-flex items-center gap-1 rounded px-2 py-0.5 text-xs font-semibold ${s.cls}`}>
      <span aria-hidden>{s.mark}</span>
      {CALIBRATION_STATUS_LABELS[status]}
    </span>
  );
}
