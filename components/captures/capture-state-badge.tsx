import type { CaptureStatusView } from "@/lib/dal/captures";

type State = CaptureStatusView["state"];

// A word and a mark for each state, never colour alone.
const STATES: Record<State, { word: string; mark: string; cls: string }> = {
  uploading: { word: "Uploading", mark: "↑", cls: "bg-ink-100 text-ink-800" },
  queued: { word: "Queued", mark: "…", cls: "bg-ink-100 text-ink-800" },
  analysing: { word: "Analysing", mark: "⟳", cls: "bg-edge-100 text-edge-700" },
  analysed: { word: "Analysed", mark: "✓", cls: "bg-within-100 text-within-700" },
  rejected: { word: "Rejected", mark: "×", cls: "bg-outside-100 text-outside-700" },
  failed: { word: "Failed", mark: "!", cls: "bg-outside-100 text-outside-700" },
};

export function captureStateWord(state: State): string {
  return STATES[state].word;
}

export function CaptureStateBadge({ state, progress }: { state: State; progress?: number }) {
  const s = STATES[state];
  return (
    <span data-testid="capture-state" data-state={state} className={`inline-flex items-center gap-1 rounded px-2 py-0.5 text-xs font-semibold ${s.cls}`}>
      <span aria-hidden>{s.mark}</span>
      {s.word}
      {state === "analysing" && progress !== undefined ? <span className="tabular-nums"> {progress} %</span> : null}
    </span>
  );
}

export function ProgressBar({ fraction, label }: { fraction: number; label: string }) {
  const percent = Math.round(Math.max(0, Math.min(1, fraction)) * 100);
  return (
    <div className="mt-2">
      <div role="progressbar" aria-label={label} aria-valuemin={0} aria-valuemax={100} aria-valuenow={percent} className="h-2 w-full overflow-hidden rounded bg-ink-100">
        <div className="h-full bg-copper-600 transition-[width]" style={{ width: `${percent}%` }} />
      </div>
      <p className="mt-1 text-xs text-ink-600">{label}: <span className="tabular-nums">{percent} %</span></p>
    </div>
  );
}
