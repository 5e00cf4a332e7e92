import Link from "next/link";
import { PageHeader } from "@/components/shell/page-header";
import { EmptyState } from "@/components/ui/empty-state";
import { Notice } from "@/components/ui/notice";
import { MACHINE_KIND_LABELS, MACHINE_KINDS } from "@/lib/analysis";
import { HttpError } from "@/lib/auth/guards";
import { requireRoleActor } from "@/lib/dal/actor";
import { listRatingsView } from "@/lib/dal/ratings";

export const metadata = { title: "Ratings" };

const SELECT = "mt-1 block rounded-md border border-ink-200 bg-white px-3 py-2 text-sm";

export default async function RatingsPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const actor = await requireRoleActor("admin", "operator", "qa");
  const raw = Object.fromEntries(Object.entries(await searchParams).map(([k, v]) => [k, Array.isArray(v) ? v[0] : v]));
  let view;
  try {
    view = await listRatingsView(actor, raw);
  } catch (err) {
    if (!(err instanceof HttpError)) throw err;
    return <Notice kind="problem" title="That filter cannot be read">{err.message}</Notice>;
  }
  return (
    <>
      <PageHeader
        title="Ratings"
        lead="Machine models your lab tests, each with its nameplate, a versioned tolerance profile and a test plan."
        actions={view.canEdit ? <Link href="/ratings/new" className="rounded-md bg-copper-600 px-4 py-2 text-sm font-semibold text-white">New rating</Link> : null}
      />
      <form method="get" className="mb-6 flex flex-wrap items-end gap-4 text-sm" aria-label="Filter ratings">
        <label className="font-semibold">Client
          <select name="client" defaultValue={view.query.client ?? ""} className={SELECT}>
            <option value="">All clients</option>
            {view.clients.map((c) => <option key={c.id} value={c.id}>{c.name}{c.active ? "" : " (deactivated)"}</option>)}
          </select>
        </label>
        <label className="font-semibold">Machine kind
          <select name="kind" defaultValue={view.query.kind ?? ""} className={SELECT}>
            <option value="">All kinds</option>
            {MACHINE_KINDS.map((k) => <option key={k} value={k}>{MACHINE_KIND_LABELS[k]}</option>)}
          </select>
        </label>
        <label className="font-semibold">Status
          <select name="retired" defaultValue={view.query.retired} className={SELECT}>
            <option value="active">In use</option><option value="retired">Retired</option><option value="all">All</option>
          </select>
        </label>
        <button type="submit" className="rounded-md px-4 py-2 font-semibold ring-1 ring-ink-200">Show</button>
      </form>
      {view.ratings.length === 0 ? <EmptyState title="No ratings match" /> : (
        <table className="min-w-full bg-white text-sm shadow-sm ring-1 ring-ink-200" aria-label="Ratings">
          <thead className="text-left text-xs uppercase tracking-wide text-ink-600">
            <tr><th className="px-3 py-2">Model code</th><th className="px-3 py-2">Title</th><th className="px-3 py-2">Client</th><th className="px-3 py-2">Machine kind</th><th className="px-3 py-2">Rated</th><th className="px-3 py-2">Units</th><th className="px-3 py-2">Profile</th><th className="px-3 py-2">Status</th></tr>
          </thead>
          <tbody>
            {view.ratings.map((r) => (
              <tr key={r.id} className="border-t border-ink-100">
                <td className="px-3 py-2 font-mono"><Link href={`/ratings/${r.id}`} className="text-copper-700 underline">{r.modelCode}</Link></td>
                <td className="px-3 py-2">{r.title}</td>
                <td className="px-3 py-2">{r.client}</td>
                <td className="px-3 py-2">{r.machineKindLabel}</td>
                <td className="px-3 py-2">{r.nameplateRows.filter((row) => row.label === "Rated voltage" || row.label === "Rated frequency").map((row) => row.value).join(" · ")}</td>
                <td className="px-3 py-2">{r.units}</td>
                <td className="px-3 py-2">{r.profileVersion ? `version ${r.profileVersion}` : "none"}</td>
                <td className="px-3 py-2">{r.retiredAt ? `Retired ${r.retiredAt.toISOString().slice(0, 10)}` : "In use"}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </>
  );
}
