import type { ReactNode } from "react";

export function EmptyState({ title, children }: { title: string; children?: ReactNode }) {
  return (
    <div className="rounded-lg border border-dashed border-ink-200 bg-white px-6 py-10 text-center">
      <p className="font-semibold text-ink-800">{title}</p>
      {children ? <div className="mt-2 text-sm text-ink-600">{children}</div> : null}
    </div>
  );
}
