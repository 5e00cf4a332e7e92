import type { ReactNode } from "react";

type Kind = "info" | "caution" | "problem" | "done";

const KINDS: Record<Kind, { box: string; mark: string }> = {
  info: { box: "border-ink-200 bg-white text-ink-800", mark: "i" },
  caution: { box: "border-edge-700/40 bg-edge-100 text-ink-900", mark: "!" },
  problem: { box: "border-outside-700/40 bg-outside-100 text-ink-900", mark: "×" },
  done: { box: "border-within-700/40 bg-within-100 text-ink-900", mark: "✓" },
};

/** A boxed message; `problem` is announced to screen readers. */
export function Notice({ kind = "info", title, children }: { kind?: Kind; title?: string; children?: ReactNode }) {
  const k = KINDS[kind];
  return (
    <div role={kind === "problem" ? "alert" : "note"} className={`flex gap-3 rounded-md border px-4 py-3 text-sm ${k.box}`}>
      <span aria-hidden className="mt-0.5 inline-flex h-5 w-5 shrink-0 items-center justify-center rounded-full bg-ink-900 text-xs font-bold text-white">{k.mark}</span>
      <div>
        {title ? <p className="font-semibold">{title}</p> : null}
        {children ? <div className={title ? "mt-1" : ""}>{children}</div> : null}
      </div>
    </div>
  );
}
