/** The standing caution shown in the shell and on upload and report pages. */
export function SafetyCaution({ compact = false }: { compact?: boolean }) {
  return (
    <aside aria-label="Safety caution" className="rounded-md border border-edge-700/40 bg-edge-100 px-4 py-3 text-sm text-ink-900">
      <p className="font-semibold">⚠ Energised rotating machines</p>
      {compact ? (
        <p className="mt-1">Captures come from live terminals. Verdicts are advisory; release is a qualified person&apos;s decision.</p>
      ) : (
        <p className="mt-1">
          Captures are taken from the live terminals of machines driven at speed. Probe only with rated differential
          probes or isolated inputs of a suitable measurement category, as a qualified person, under your local
          electrical codes and the site&apos;s lock-out rules. Emfolio&apos;s verdicts are advisory measurements: releasing
          a unit is a person&apos;s decision under licensed practice.
        </p>
      )}
    </aside>
  );
}
