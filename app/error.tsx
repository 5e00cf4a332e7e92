"use client";

export default function ErrorPage({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <main className="mx-auto max-w-lg px-4 py-20 text-center">
      <h1 className="text-2xl font-bold">Something went wrong</h1>
      <p className="mt-2 text-ink-600">The page could not be shown. Nothing you saved was lost.</p>
      {error.digest ? <p className="mt-2 font-mono text-xs text-ink-400">Reference {error.digest}</p> : null}
      <button type="button" onClick={reset} className="mt-6 rounded-md bg-copper-600 px-4 py-2 font-semibold text-white">
        Try again
      </button>
    </main>
  );
}
