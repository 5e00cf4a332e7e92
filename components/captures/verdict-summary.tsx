import type { AnalysisReport, VerdictStatus } from "@/lib/analysis";
import { formatFigureWithUnit, quantityFor } from "@/lib/verdicts/format-figure";
import { marginOf } from "@/lib/verdicts/margin";
import { verdictWord } from "@/lib/verdicts/words";
import { StatusTag, verdictMark } from "@/components/ui/status-tag";

export const BANNER: Record<VerdictStatus, string> = {
  pass: "bg-within-100 text-within-700 ring-within-700/30",
  marginal: "bg-edge-100 text-edge-700 ring-edge-700/30",
  inconclusive: "bg-ink-100 text-ink-900 ring-ink-600",
  fail: "bg-outside-100 text-outside-700 ring-outside-700/40",
  "not-required": "bg-ink-100 text-ink-600 ring-ink-200",
  "not-applicable": "bg-ink-100 text-ink-600 ring-ink-200",
};


// Outside first, then near the edge, then those that could not be judged.
const ATTENTION: VerdictStatus[] = ["fail", "marginal", "inconclusive"];

/** A verdict in large type with its mark, for the first thing a page says. */
export function OverallWord({ status }: { status: VerdictStatus | null }) {
  return (
    <p className="mt-1 text-3xl font-bold sm:text-4xl" data-testid="overall-word" data-status={status ?? "none"}>
      <span aria-hidden className="mr-2">{verdictMark(status)}</span>{verdictWord(status)}
    </p>
  );
}

/**
 * The overall verdict, large and first, then each check that is outside, near its edge or could
 * not be judged, with its distance to the limit (or why it is inconclusive).
 */
export function VerdictSummary({ report }: { report: AnalysisReport }) {
  const overall = report.overall;
  const flagged = ATTENTION.flatMap((status) => report.verdicts.filter((v) => v.status === status));
  const judged = report.verdicts.filter((v) => v.status !== "not-required").length;
  return (
    <section aria-label="Overall verdict" data-testid="verdict-summary" className={`rounded-lg p-4 ring-1 ${BANNER[overall]}`}>
      <p className="text-xs font-semibold uppercase tracking-wide">Overall verdict</p>
      <OverallWord status={overall} />
      <p className="mt-1 text-sm">
        {report.verdicts.length === 0
          ? "Nothing was judged: the capture was analysed without a rating."
          : flagged.length === 0 ? `All ${judged} judged checks are within their limits.` : `${flagged.length} of ${judged} judged checks need attention:`}
      </p>
      {flagged.length > 0 ? (
        <ul className="mt-2 space-y-1.5 text-sm text-ink-900">
          {flagged.map((v) => {
            const margin = v.status === "inconclusive" ? null : marginOf(v);
            const measured = typeof v.measured === "string" ? v.measured : formatFigureWithUnit(v.measured, v.unit, { quantity: quantityFor(v.unit, v.check) });
            return (
              <li key={v.check} data-check={v.check} className="flex flex-wrap items-baseline gap-x-2 rounded bg-white/70 px-2 py-1">
                <StatusTag status={v.status} />
                <span className="font-semibold">{v.label}</span>
                <span className="tabular-nums">{measured}</span>
                {margin ? <span className="tabular-nums text-ink-800" data-testid="margin">{margin.words}</span> : null}
                {v.status === "inconclusive" && v.reason ? <span className="text-ink-800">{v.reason}</span> : null}
              </li>
            );
          })}
        </ul>
      ) : null}
      <p className="mt-2 text-xs">Advisory: release of the unit is a qualified person&apos;s decision.</p>
    </section>
  );
}
