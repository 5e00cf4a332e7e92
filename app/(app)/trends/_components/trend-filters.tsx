import { TEST_KIND_LABELS, TEST_KINDS } from "@/lib/captures/input-schemas";
import { HARMONIC_FIGURE } from "@/lib/trends/figure-rows";
import { TREND_FIGURE_LABELS, TREND_FIGURES, type TrendQuery } from "@/lib/trends/query";

const SELECT = "mt-1 block rounded-md border border-ink-200 bg-white px-3 py-2 text-sm";

type Options = { clients: { id: string; name: string }[]; benches: { id: string; name: string }[]; instruments: { id: string; label: string }[] };

/** The trend's query as a GET form: the URL is the view, so it can be bookmarked and exported. */
export function TrendFilters({ query, ratingId, options, present }: { query: TrendQuery; ratingId: string; options: Options; present: Set<string> }) {
  return (
    <form method="get" action="/trends" aria-label="Trend filters" className="mb-6 flex flex-wrap items-end gap-4 text-sm">
      <input type="hidden" name="rating" value={ratingId} />
      <label className="font-semibold">Figure
        <select name="figure" defaultValue={query.figure} className={SELECT}>
          {TREND_FIGURES.map((f) => <option key={f} value={f}>{TREND_FIGURE_LABELS[f]}{present.has(f) ? "" : " (no data)"}</option>)}
        </select>
      </label>
      <label className="font-semibold">Harmonic order
        <input name="order" type="number" min={2} max={50} defaultValue={query.order} className={`${SELECT} w-24`} aria-describedby="order-note" />
        <span id="order-note" className="block text-xs font-normal text-ink-600">for “{TREND_FIGURE_LABELS[HARMONIC_FIGURE]}”</span>
      </label>
      <label className="font-semibold">Along
        <select name="x" defaultValue={query.x} className={SELECT}>
          <option value="serial">Serial</option>
          <option value="date">Date measured</option>
        </select>
      </label>
      <label className="font-semibold">From
        <input name="from" type="date" defaultValue={query.from ?? ""} className={SELECT} />
      </label>
      <label className="font-semibold">To
        <input name="to" type="date" defaultValue={query.to ?? ""} className={SELECT} />
      </label>
      <label className="font-semibold">Client
        <select name="client" defaultValue={query.client ?? ""} className={SELECT}>
          <option value="">All</option>
          {options.clients.map((c) => <option key={c.id} value={c.id}>{c.name}</option>)}
        </select>
      </label>
      <label className="font-semibold">Test kind
        <select name="kind" defaultValue={query.kind ?? ""} className={SELECT}>
          <option value="">All</option>
          {TEST_KINDS.map((k) => <option key={k} value={k}>{TEST_KIND_LABELS[k]}</option>)}
        </select>
      </label>
      <label className="font-semibold">Bench
        <select name="bench" defaultValue={query.bench ?? ""} className={SELECT}>
          <option value="">All</option>
          {options.benches.map((b) => <option key={b.id} value={b.id}>{b.name}</option>)}
        </select>
      </label>
      <label className="font-semibold">Instrument
        <select name="instrument" defaultValue={query.instrument ?? ""} className={SELECT}>
          <option value="">Any</option>
          {options.instruments.map((i) => <option key={i.id} value={i.id}>{i.label}</option>)}
        </select>
      </label>
      <button type="submit" className="rounded-md px-4 py-2 font-semibold ring-1 ring-ink-200">Show</button>
    </form>
  );
}
