import Link from "next/link";
import type { TrendPoint } from "@/lib/trends/types";

const RULE_WORDS: Record<number, string> = { 1: "beyond 3σ", 2: "2 of 3 beyond 2σ", 3: "4 of 5 beyond 1σ", 4: "8 on one side" };

/** The plotted points as a table, in the order drawn: the same rows the CSV export holds. */
export function TrendPoints({ points, unit }: { points: TrendPoint[]; unit: string }) {
  return (
    <table className="mt-3 w-full text-left text-sm" aria-label="Plotted points" data-testid="trend-points">
      <thead className="text-xs uppercase text-ink-600">
        <tr className="[&>th]:px-2 [&>th]:py-1"><th>Serial</th><th>Measured</th><th className="text-right">Value{unit ? ` (${unit})` : ""}</th><th>In statistics</th><th>Verdict</th><th>Run rules</th><th>Bench</th></tr>
      </thead>
      <tbody>
        {points.map((p) => (
          <tr key={p.unitId} className="border-t border-ink-100 [&>td]:px-2 [&>td]:py-1" data-serial={p.serial} data-value={p.value} data-flagged={p.flagged ? "yes" : "no"}>
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
  );
}
