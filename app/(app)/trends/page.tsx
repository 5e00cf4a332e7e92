import Link from "next/link";
import { notFound } from "next/navigation";
import { PageHeader } from "@/components/shell/page-header";
import { TrendChart } from "@/components/trends/trend-chart";
import { EmptyState } from "@/components/ui/empty-state";
import { Notice } from "@/components/ui/notice";
import { HttpError } from "@/lib/auth/guards";
import { getTrendView } from "@/lib/dal/trends";
import { HARMONIC_FIGURE } from "@/lib/trends/figure-rows";
import { parseTrendQuery, trendQueryString } from "@/lib/trends/query";
import { TrendFilters } from "./_components/trend-filters";
import { TrendPoints } from "./_components/trend-points";
import { TrendSummary } from "./_components/trend-summary";

export const metadata = { title: "Trends" };

export default async function TrendsPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const { query, errors } = parseTrendQuery(await searchParams);
  if (!query) {
    return (
      <>
        <PageHeader title="Trends" />
        <Notice kind="problem" title="This trend's address has a bad parameter">
          <ul>{errors.map((e) => <li key={e}>{e}</li>)}</ul>
          <p className="mt-2"><Link href="/trends">Start again</Link></p>
        </Notice>
      </>
    );
  }
  let view;
  try {
    view = await getTrendView(query);
  } catch (err) {
    if (err instanceof HttpError && err.status === 404) notFound();
    throw err;
  }
  const { rating, band, summary, points } = view;
  const unit = band?.unit ?? (query.figure === HARMONIC_FIGURE ? "%" : "");
  const present = new Set(view.figures.map((f) => f.figure));
  const flagged = points.filter((p) => p.flagged).length;
  const qs = trendQueryString({ ...query, rating: rating?.id });
  return (
    <>
      <PageHeader title="Trends" lead="Each unit's figure of record (the capture of record of its plan step, else its latest valid capture) against the band of the profile in force. Flagged captures are drawn apart and left out of the statistics. Verdicts are advisory." />
      <nav aria-label="Models" className="mb-4 flex flex-wrap gap-2 text-sm">
        {view.ratings.map((r) => (
          <Link key={r.id} href={`/trends?${trendQueryString({ rating: r.id, figure: query.figure, order: query.order, x: query.x })}`} aria-current={rating?.id === r.id ? "true" : undefined}
            className="rounded-full px-3 py-1 no-underline ring-1 ring-ink-200 aria-[current=true]:bg-ink-800 aria-[current=true]:text-white">
            {r.modelCode} ({r.unitCount})
          </Link>
        ))}
      </nav>
      {!rating ? <EmptyState title="No models with units yet">Trends appear once units of a model have analysed captures.</EmptyState> : (
        <>
          <TrendFilters query={query} ratingId={rating.id} options={view.options} present={present} />
          <section aria-labelledby="trend-title" className="mb-6 rounded-lg bg-white p-4 shadow-sm ring-1 ring-ink-200">
            <div className="flex flex-wrap items-baseline justify-between gap-2">
              <h2 id="trend-title" className="font-semibold">{rating.modelCode} · {view.label}</h2>
              {points.length > 0 ? <a href={`/trends/export?${qs}`} className="text-sm font-semibold" download>Export these points (CSV)</a> : null}
            </div>
            {points.length === 0 ? (
              <p className="mt-2 text-sm text-ink-600">No unit of this model has this figure for the filters chosen.</p>
            ) : (
              <div data-band-lower={band?.lower ?? ""} data-band-upper={band?.upper ?? ""} data-ucl={summary?.ucl ?? ""} data-lcl={summary?.lcl ?? ""} data-centre={summary?.mean ?? ""}>
                <TrendChart label={view.label} unit={unit} byDate={query.x === "date"} band={band}
                  limits={{ centre: summary?.mean ?? null, ucl: summary?.ucl ?? null, lcl: summary?.lcl ?? null }}
                  points={points.map((p) => ({ serial: p.serial, t: Date.parse(p.measuredAt), value: p.value, flagged: p.flagged, ruled: p.rules.length > 0 }))} />
                <p className="mt-2 text-xs text-ink-600">Shaded: the band (green) and its marginal zones (amber). Dashed: the control limits. Hollow grey: flagged. Ringed red: breaks a run rule.</p>
              </div>
            )}
            {view.missing.length > 0 ? <p className="mt-2 text-sm text-ink-600">No figure (not computable) for: {view.missing.map((m) => m.serial).join(", ")}.</p> : null}
            {points.length > 0 ? <TrendPoints points={points} unit={unit} /> : null}
          </section>
          <TrendSummary summary={summary} band={band} flagged={flagged} unit={unit} />
        </>
      )}
    </>
  );
}
