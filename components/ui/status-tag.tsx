import { verdictWord } from "@/lib/verdicts/words";
import type { VerdictStatus } from "@/lib/analysis";

// Verdict tags carry a word and a shape, never colour alone.
const STYLES: Record<VerdictStatus | "none", { cls: string; mark: string }> = {
  pass: { cls: "bg-within-100 text-within-700", mark: "●" },
  marginal: { cls: "bg-edge-100 text-edge-700", mark: "◆" },
  inconclusive: { cls: "bg-ink-100 text-ink-900 ring-1 ring-ink-600", mark: "?" },
  fail: { cls: "bg-outside-100 text-outside-700", mark: "▲" },
  "not-required": { cls: "bg-ink-100 text-ink-600", mark: "–" },
  "not-applicable": { cls: "bg-ink-100 text-ink-600", mark: "○" },
  none: { cls: "bg-ink-100 text-ink-600", mark: "○" },
};

/** The shape beside each verdict word, shared by the tag and the large verdict of a page. */
export function verdictMark(status: VerdictStatus | null | undefined): string {
  return STYLES[status ?? "none"].mark;
}

export function StatusTag({ status }: { status: VerdictStatus | null | undefined }) {
  const s = STYLES[status ?? "none"];
  return (
    <span className={`inline-flex items-center gap-1 rounded px-2 py-0.5 text-xs font-semibold ${s.cls}`}>
      <span aria-hidden>{s.mark}</span>
      {verdictWord(status)}
    </span>
  );
}
