import Link from "next/link";
import { PageHeader } from "@/components/shell/page-header";
import { EmptyState } from "@/components/ui/empty-state";
import { StatusTag } from "@/components/ui/status-tag";
import { PLAN_STATE_WORDS } from "@/components/units/plan-panel";
import { getUnitListView, unitListQuerySchema } from "@/lib/dal/units";

export const metadata = { title: "Units" };

const FILTERS = [
  { value: "", label: "All" }, { value: "fail", label: "Outside" }, { value: "marginal", label: "Near edge" },
  { value: "pass", label: "Within" }, { value: "untested", label: "Untested" },
];

export default async function UnitsPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const raw = await searchParams;
  const parsed = unitListQuerySchema.safeParse({ q: raw.q, overall: raw.overall || undefined, page: raw.page });
  const query = parsed.success ? parsed.data : { page: 1 };
  const view = await getUnitListView(query);
  const link = (overrides: Record<string, string | number | undefined>) => {
    const p = new URLSearchParams();
    const merged = { q: query.q, overall: query.overall, page: query.page, ...overrides };
    for (const [k, v] of Object.entries(merged)) if (v !== undefined && v !== "" && !(k === "page" && v === 1)) p.set(k, String(v));
    return `/units${p.size ? `?${p}` : ""}`;
  };
  return (
    <>
      <PageHeader title="Units" lead="Every unit with its latest verdict and where it stands against its test plan. Search by serial number."
        actions={view.canRegister ? <Link href="/units/new" className="rounded-md bg-copper-600 px-3 py-2 text-sm font-semibold text-white no-underline">Register a unit</Link> : null} />
      <form className="mb-4 flex flex-wrap items-end gap-3" role="search">
        <label className="text-sm">
          <span className="block font-semibold">Serial contains</span>
          <input name="q" defaultValue={query.q ?? ""} className="mt-1 rounded-md border border-ink-200 px-3 py-2" />
        </label>
        {query.overall ? <input type="hidden" name="overall" value={query.overall} /> : null}
        <button className="rounded-md bg-ink-800 px-4 py-2 text-sm font-semibold text-white">Search</button>
      </form>
      <nav aria-label="Filter by verdict" className="mb-4 flex flex-wrap gap-2 text-sm">
        {FILTERS.map((f) => (
          <Link key={f.value} href={link({ overall: f.value || undefined, page: 1 })}
            aria-current={(query.overall ?? "") === f.value ? "true" : undefined}
            className="rounded-full px-3 py-1 no-underline ring-1 ring-ink-200 aria-[current=true]:bg-ink-800 aria-[current=true]:text-white">
            {f.label}
          </Link>
        ))}
      </nav>
      {view.rows.length === 0 ? (
        <EmptyState title="No units match">Clear the search or the filter to see more.</EmptyState>
      ) : (
        <div className="overflow-x-auto rounded-lg bg-white shadow-sm ring-1 ring-ink-200">
          <table className="min-w-full text-sm">
            <thead className="bg-ink-100 text-left text-xs uppercase tracking-wide text-ink-600">
              <tr>
                <th className="px-4 py-2">Serial</th><th className="px-4 py-2">Model</th>
                {view.showOwner ? <th className="px-4 py-2">Client</th> : null}
                <th className="px-4 py-2">Captures</th><th className="px-4 py-2">Latest verdict</th><th className="px-4 py-2">Test plan</th><th className="px-4 py-2">Disposition</th>
              </tr>
            </thead>
            <tbody>
              {view.rows.map((u) => (
                <tr key={u.id} className="border-t border-ink-100">
                  <td className="whitespace-nowrap px-4 py-2 font-mono"><Link href={`/units/${u.id}`}>{u.serial}</Link></td>
                  <td className="px-4 py-2">{u.modelCode} · {u.ratingTitle}</td>
                  {view.showOwner ? <td className="px-4 py-2">{u.owner}</td> : null}
                  <td className="px-4 py-2 tabular-nums">{u.captureCount}</td>
                  <td className="px-4 py-2"><StatusTag status={u.latestOverall} /></td>
                  <td className="px-4 py-2 text-xs">{PLAN_STATE_WORDS[u.planState]}</td>
                  <td className="px-4 py-2">{u.disposition}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      <div className="mt-4 flex gap-4 text-sm">
        {view.page > 1 ? <Link href={link({ page: view.page - 1 })}>← Previous</Link> : null}
        {view.hasMore ? <Link href={link({ page: view.page + 1 })}>Next →</Link> : null}
      </div>
    </>
  );
}
