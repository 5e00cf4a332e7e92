import Link from "next/link";
import type { TrendPoint } from "@/lib/trends/types";

const RULE_WORDS: Record<number, string> = { 1: "beyond 3σ", 2: "2 of 3 beyond 2σ", 3: "4 of 5 beyond 1σ", 4: "8 on one side" };

/** Rows the page's table shows at most: the chart and the CSV export carry every point. */
export const TREND_TABLE_ROWS = 200;

/** The plotted points as a table, in the order drawn: the same rows the CSV export holds (the first TREND_TABLE_ROWS). */
export function TrendPoints({ points, unit }: { points: TrendPoint[]; unit: string }) {
  const shown = points.slice(0, TREND_TABLE_ROWS);
  return (
    <>
    {shown.length < points.length ? (
      <p className="mt-3 text-sm text-ink-600" data-testid="trend-points-capped">The table lists the first {shown.length} of {points.length} points; the chart and the CSV export hold them all.</p>
    ) : null}
    <table className="mt-3 w-full text-left text-sm" aria-label="Plotted points" data-testid="trend-points">
      <thead className="text-xs uppercase text-ink-600">
        <tr className="[&>th]:px-2 [&>th]:py-1"><th>Serial</th><th>Measured</th><th className="text-right">Value{unit ? ` (${unit})` : ""}</th><th>In statistics</th><th>Verdict</th><th>Run rules</th><th>Bench</th></tr>
      </thead>
      <tbody className="[&_td]:px-2 [&_td]:py-1 [&_tr]:border-t [&_tr]:border-ink-100">
        {shown.map((p) => (
          <tr key={p.unitId} data-serial={p.serial} data-value={p.value} data-flagged={p.flagged ? "yes" : "no"}>
            <td><Link href={`/captures/${p.captureId}`}>{p.serial}</Link></td>
            <td>{p.measuredAt.slice(0, 10)}</td>
            <td className="text-right tabular-nums">{String(Number(p.value.toPrecision(7)))}</td>
            <td>{p.flagged ? "no, flagged" : "yes"}</td>
            <td>{p.status ?? "—"}</td>
            <td>{p.rules.map((r) => RULE_WORDS[r]).join("; ") || "—"}</td>
            <td>{p.bench ?? "—"}</td>
          </tr>
        ))}
      </tbody>
    </table>
    </>
  );
}
