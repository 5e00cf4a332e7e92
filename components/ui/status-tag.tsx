// Verdict tags carry a word and a shape, never colour alone.
const STYLES = {
  pass: { cls: "bg-within-100 text-within-700", mark: "●", word: "Within" },
  marginal: { cls: "bg-edge-100 text-edge-700", mark: "◆", word: "Near edge" },
  fail: { cls: "bg-outside-100 text-outside-700", mark: "▲", word: "Outside" },
  "not-applicable": { cls: "bg-ink-100 text-ink-600", mark: "○", word: "Not judged" },
} as const;

export type VerdictWord = keyof typeof STYLES;

export function StatusTag({ status }: { status: VerdictWord | null | undefined }) {
  const s = STYLES[status ?? "not-applicable"];
  return (
    <span className={`inline-flex items-center gap-1 rounded px-2 py-0.5 text-xs font-semibold ${s.cls}`}>
      <span aria-hidden>{s.mark}</span>
      {s.word}
    </span>
  );
}
