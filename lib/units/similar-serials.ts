// Close matches of a serial among those on file, to catch a typo before it registers a new unit.
// Browser-safe and pure.

/** Levenshtein distance with adjacent transpositions (optimal string alignment), case-insensitive. */
export function serialDistance(a: string, b: string): number {
  const s = a.toUpperCase();
  const t = b.toUpperCase();
  const d: number[][] = Array.from({ length: s.length + 1 }, (_, i) => Array.from({ length: t.length + 1 }, (_, j) => (i === 0 ? j : j === 0 ? i : 0)));
  for (let i = 1; i <= s.length; i++) {
    for (let j = 1; j <= t.length; j++) {
      const cost = s[i - 1] === t[j - 1] ? 0 : 1;
      const row = d[i] as number[];
      const prev = d[i - 1] as number[];
      row[j] = Math.min((prev[j] as number) + 1, (row[j - 1] as number) + 1, (prev[j - 1] as number) + cost);
      if (i > 1 && j > 1 && s[i - 1] === t[j - 2] && s[i - 2] === t[j - 1]) row[j] = Math.min(row[j] as number, ((d[i - 2] as number[])[j - 2] as number) + 1);
    }
  }
  return (d[s.length] as number[])[t.length] as number;
}

/** Serials within two edits (or equal but for case and separators), closest first, at most `limit`. */
export function similarSerials(serial: string, known: readonly string[], limit = 5): string[] {
  const squash = (x: string) => x.toUpperCase().replace(/[\s._/-]+/g, "");
  const wanted = serial.trim();
  if (!wanted) return [];
  return known
    .filter((k) => k !== wanted)
    .map((k) => ({ k, d: squash(k) === squash(wanted) ? 0 : serialDistance(k, wanted) }))
    .filter((x) => x.d <= 2)
    .sort((a, b) => a.d - b.d || a.k.localeCompare(b.k))
    .slice(0, limit)
    .map((x) => x.k);
}
