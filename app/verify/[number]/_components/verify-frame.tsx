import type { ReactNode } from "react";

export function VerifyFrame({ children }: { children: ReactNode }) {
  return (
    <main className="mx-auto flex min-h-screen max-w-2xl flex-col gap-6 px-4 py-10">
      <div>
        <p className="text-3xl font-bold tracking-tight text-ink-900">Em<span className="text-copper-600">folio</span></p>
        <p className="mt-1 text-sm text-ink-600">Verification of a released test report.</p>
      </div>
      {children}
      <p className="text-xs text-ink-600">
        This page confirms that a report was released under its number and which file belongs to each revision. The results in a
        report are advisory measurements and relate only to the item tested.
      </p>
    </main>
  );
}
