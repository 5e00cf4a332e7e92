import { CAPABLE_CPK, CAPABILITY_MIN_POINTS, type SpcSummary } from "@/lib/analysis";
import type { TrendBand } from "@/lib/trends/band";

const fmt = (v: number | null, digits = 5) => (v === null ? "—" : String(Number(v.toPrecision(digits))));

/** n, mean, spread, the I-MR limits and capability, with which σ and how many points they rest on. */
export function TrendSummary({ summary, band, flagged, unit }: { summary: SpcSummary | null; band: TrendBand | null; flagged: number; unit: string }) {
  const u = unit ? ` ${unit}` : "";
  const bandText = band ? `${band.lower === null ? "up to" : `${fmt(band.lower)} …`} ${fmt(band.upper)}${u}` : "no band: the check is not required, or the profile is incomplete";
  const rows: [string, string, string][] = summary ? [
    ["n", String(summary.n), "points in the statistics"],
    ["mean", `${fmt(summary.mean, 6)}${u}`, "centre line"],
    ["s", `${fmt(summary.sd)}${u}`, "sample standard deviation (overall)"],
    ["MR̄", `${fmt(summary.mrBar)}${u}`, "mean moving range"],
    ["σ within", `${fmt(summary.sigmaWithin)}${u}`, "MR̄ / 1.128: behind the limits, Cp and Cpk"],
    ["UCL", `${fmt(summary.ucl, 6)}${u}`, "mean + 3σ within"],
    ["LCL", `${fmt(summary.lcl, 6)}${u}`, "mean − 3σ within"],
    ["MR UCL", `${fmt(summary.mrUcl)}${u}`, "3.267 · MR̄"],
    ["Cp", fmt(summary.cp, 3), summary.indicative ? `indicative: fewer than ${CAPABILITY_MIN_POINTS} points` : "(USL − LSL) / 6σ within"],
    ["Cpk", fmt(summary.cpk, 3), summary.indicative ? `indicative: fewer than ${CAPABILITY_MIN_POINTS} points` : `min distance to a limit / 3σ within; ${CAPABLE_CPK} or more reads capable`],
  ] : [];
  return (
    <section aria-labelledby="trend-stats" className="rounded-lg bg-white p-4 shadow-sm ring-1 ring-ink-200">
      <h2 id="trend-stats" className="font-semibold">Statistics</h2>
      <p className="mt-1 text-sm" data-testid="trend-band">Band: {bandText}</p>
      {flagged > 0 ? <p className="mt-1 text-sm text-ink-600">{flagged} flagged point(s) drawn apart and left out (inconclusive, clipped, wrongly scaled or warned).</p> : null}
      {summary ? (
        <dl className="mt-3 grid grid-cols-[auto_auto_1fr] gap-x-4 gap-y-1 text-sm" aria-label="Control statistics">
          {rows.map(([k, v, note]) => (
            <div key={k} className="contents" data-stat={k}>
              <dt className="font-semibold">{k}</dt>
              <dd className="tabular-nums">{v}</dd>
              <dd className="text-xs text-ink-600">{note}</dd>
            </div>
          ))}
        </dl>
      ) : <p className="mt-2 text-sm text-ink-600">No points in the statistics.</p>}
    </section>
  );
}
