import Link from "next/link";
import { PageHeader } from "@/components/shell/page-header";
import { TrendChart } from "@/components/trends/trend-chart";
import { EmptyState } from "@/components/ui/empty-state";
import { getTrendsView } from "@/lib/dal/trends";

export const metadata = { title: "Trends" };

const fmt = (v: number) => String(Number(v.toPrecision(4)));

export default async function TrendsPage({ searchParams }: { searchParams: Promise<{ rating?: string }> }) {
  const view = await getTrendsView((await searchParams).rating);
  return (
    <>
      <PageHeader title="Trends" lead="How a model's units measure across serial numbers: current analysis of every capture, oldest first." />
      <nav aria-label="Models" className="mb-6 flex flex-wrap gap-2 text-sm">
        {view.ratings.map((r) => (
          <Link key={r.id} href={`/trends?rating=${r.id}`} aria-current={view.rating?.id === r.id ? "true" : undefined}
            className="rounded-full px-3 py-1 no-underline ring-1 ring-ink-200 aria-[current=true]:bg-ink-800 aria-[current=true]:text-white">
            {r.modelCode} ({r.unitCount})
          </Link>
        ))}
      </nav>
      {view.metrics.length === 0 ? (
        <EmptyState title="No analysed captures for this model yet">Trends appear once the worker has analysed captures of its units.</EmptyState>
      ) : (
        <div className="grid gap-6 lg:grid-cols-2">
          {view.metrics.map((m) => (
            <section key={m.key} className="rounded-lg bg-white p-4 shadow-sm ring-1 ring-ink-200" aria-labelledby={`t-${m.key}`}>
              <h2 id={`t-${m.key}`} className="font-semibold">{m.label}</h2>
              {m.summary ? (
                <p className="mb-2 text-xs text-ink-600">
                  n = {m.summary.n} · mean {fmt(m.summary.mean)} {m.unit} · s = {fmt(m.summary.sd)} · range {fmt(m.summary.min)} … {fmt(m.summary.max)}
                </p>
              ) : null}
              <TrendChart label={m.label} unit={m.unit} series={m.series} />
            </section>
          ))}
        </div>
      )}
    </>
  );
}
