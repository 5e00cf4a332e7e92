import type { ReactNode } from "react";
import { BANNER, OverallWord } from "@/components/captures/verdict-summary";
import type { Rating, VerdictStatus } from "@/lib/analysis";
import { describeNameplate } from "@/lib/ratings/describe";

type Props = {
  latestOverall: VerdictStatus | null;
  planState: string;
  disposition: string;
  registered: string;
  modelCode: string;
  nameplate: Rating;
};

function Item({ label, children }: { label: string; children: ReactNode }) {
  return <div><dt className="text-ink-600">{label}</dt><dd className="mt-1 font-semibold">{children}</dd></div>;
}

/**
 * The head of a unit page: the latest verdict large and first, then the plan state, disposition
 * and the rating's nameplate in words and units (never its stored keys).
 */
export function UnitSummary({ latestOverall, planState, disposition, registered, modelCode, nameplate }: Props) {
  const banner = latestOverall ? BANNER[latestOverall] : "bg-ink-100 text-ink-600 ring-ink-200";
  return (
    <div className="space-y-4">
      <section aria-label="Latest verdict" className={`rounded-lg p-4 ring-1 ${banner}`}>
        <p className="text-xs font-semibold uppercase tracking-wide">Latest verdict</p>
        <OverallWord status={latestOverall} />
        <p className="mt-1 text-xs">The verdict of the unit&apos;s most recent analysed capture; advisory, the release is a qualified person&apos;s decision.</p>
      </section>
      <dl className="grid grid-cols-2 gap-4 rounded-lg bg-white p-5 text-sm shadow-sm ring-1 ring-ink-200 md:grid-cols-4">
        <Item label="Test plan">{planState}</Item>
        <Item label="Disposition">{disposition}</Item>
        <Item label="Registered">{registered}</Item>
        <Item label="Model"><span className="font-mono">{modelCode}</span></Item>
      </dl>
      <section aria-labelledby="nameplate" className="rounded-lg bg-white p-5 text-sm shadow-sm ring-1 ring-ink-200">
        <h2 id="nameplate" className="mb-3 font-semibold">Rating</h2>
        <dl className="grid grid-cols-1 gap-x-6 gap-y-2 sm:grid-cols-2 md:grid-cols-3" data-testid="nameplate">
          {describeNameplate(nameplate).map((row) => (
            <div key={row.label}><dt className="text-ink-600">{row.label}</dt><dd className="tabular-nums">{row.value}</dd></div>
          ))}
        </dl>
      </section>
    </div>
  );
}
