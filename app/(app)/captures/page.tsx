import Link from "next/link";
import { RefreshWhileBusy } from "@/components/captures/refresh-while-busy";
import { ReanalyseRatingForm } from "@/components/captures/reanalyse-rating-form";
import { PageHeader } from "@/components/shell/page-header";
import { EmptyState } from "@/components/ui/empty-state";
import { requirePageActor } from "@/lib/dal/actor";
import { captureListQuerySchema, type CaptureListQuery } from "@/lib/captures/list-query";
import { getCaptureListView } from "@/lib/dal/capture-list";
import { getReanalysisRatings } from "@/lib/dal/captures";
import { CaptureFilters } from "./_components/capture-filters";
import { CaptureListTable, type ListLink } from "./_components/capture-list-table";

export const metadata = { title: "Captures" };

export default async function CapturesPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const actor = await requirePageActor();
  const parsed = captureListQuerySchema.safeParse(await searchParams);
  const query: CaptureListQuery = parsed.success ? parsed.data : captureListQuerySchema.parse({});
  const view = await getCaptureListView(actor, query);
  const ratings = actor.role === "admin" ? await getReanalysisRatings() : [];
  const link: ListLink = (overrides) => {
    const merged: Record<string, string | number | undefined> = { ...query, ...overrides };
    const p = new URLSearchParams();
    for (const [k, v] of Object.entries(merged)) {
      const isDefault = (k === "page" && v === 1) || (k === "sort" && v === "captured") || (k === "dir" && v === "desc");
      if (v !== undefined && v !== "" && !isDefault) p.set(k, String(v));
    }
    return `/captures${p.size ? `?${p}` : ""}`;
  };
  // By capture time the neighbours are read from this page's first or last row; page 1 needs no place.
  const previous = view.page <= 2 || !view.before ? link({ page: Math.max(1, view.page - 1), after: undefined, before: undefined })
    : link({ page: view.page - 1, before: view.before, after: undefined });
  const filtered = Boolean(query.q || query.state || query.overall || query.kind);
  return (
    <>
      <PageHeader title="Captures" lead="Every capture of the units you may see. Filter by serial, state, verdict or test; sort on a figure by its column." />
      <RefreshWhileBusy states={view.rows.map((r) => r.state)} />
      {ratings.length > 0 ? <div className="mb-6"><ReanalyseRatingForm ratings={ratings} /></div> : null}
      <CaptureFilters query={query} />
      {!parsed.success ? <p className="mb-3 text-sm text-outside-700">The filter in the address was not understood; showing every capture.</p> : null}
      {view.rows.length === 0 ? (
        <EmptyState title={filtered ? "No captures match" : "No captures yet"}>{filtered ? <Link href="/captures">Clear the filters</Link> : null}</EmptyState>
      ) : (
        <CaptureListTable rows={view.rows} query={query} link={link} />
      )}
      <div className="mt-4 flex gap-4 text-sm">
        {view.hasPrevious ? <Link href={previous}>← Previous</Link> : null}
        {view.hasMore ? <Link href={link({ page: view.page + 1, after: view.after, before: undefined })}>Next →</Link> : null}
        {view.hasPrevious || view.hasMore ? <span className="text-ink-600">Page {view.page}</span> : null}
      </div>
    </>
  );
}
