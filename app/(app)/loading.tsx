export default function Loading() {
  return (
    <div role="status" aria-live="polite" className="animate-pulse space-y-4">
      <div className="h-8 w-64 rounded bg-ink-100" />
      <div className="h-32 rounded-lg bg-white ring-1 ring-ink-200" />
      <span className="sr-only">Loading…</span>
    </div>
  );
}
