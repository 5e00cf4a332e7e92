import Link from "next/link";
import { CaptureStateBadge } from "@/components/captures/capture-state-badge";
import { RefreshWhileBusy } from "@/components/captures/refresh-while-busy";
import { ReanalyseRatingForm } from "@/components/captures/reanalyse-rating-form";
import { PageHeader } from "@/components/shell/page-header";
import { EmptyState } from "@/components/ui/empty-state";
import { StatusTag } from "@/components/ui/status-tag";
import { requireUser } from "@/lib/auth/guards";
import { actorForUser } from "@/lib/dal/actor";
import { getRecentCaptures, getReanalysisRatings } from "@/lib/dal/captures";

export const metadata = { title: "Captures" };

export default async function CapturesPage() {
  const user = await requireUser();
  const rows = await getRecentCaptures(actorForUser(user), 100);
  const ratings = user.role === "admin" ? await getReanalysisRatings() : [];
  return (
    <>
      <PageHeader title="Captures" lead="The latest captures of every unit you may see, newest first." />
      <RefreshWhileBusy states={rows.map((r) => r.state)} />
      {ratings.length > 0 ? <div className="mb-6"><ReanalyseRatingForm ratings={ratings} /></div> : null}
      {rows.length === 0 ? <EmptyState title="No captures yet" /> : (
        <div className="overflow-x-auto rounded-lg bg-white shadow-sm ring-1 ring-ink-200">
          <table className="min-w-full text-sm">
            <thead className="bg-ink-100 text-left text-xs uppercase tracking-wide text-ink-600">
              <tr><th className="px-4 py-2">Captured</th><th className="px-4 py-2">Unit</th><th className="px-4 py-2">File</th><th className="px-4 py-2">State</th><th className="px-4 py-2">Verdict</th></tr>
            </thead>
            <tbody>
              {rows.map((r) => (
                <tr key={r.id} className="border-t border-ink-100">
                  <td className="px-4 py-2 tabular-nums">{r.createdAt.toISOString().slice(0, 16).replace("T", " ")}</td>
                  <td className="px-4 py-2 font-mono"><Link href={`/units/${r.unitId}`}>{r.serial}</Link></td>
                  <td className="px-4 py-2 font-mono"><Link href={`/captures/${r.id}`}>{r.originalName}</Link></td>
                  <td className="px-4 py-2"><CaptureStateBadge state={r.state} progress={r.progress} /></td>
                  <td className="px-4 py-2">{r.state === "analysed" ? <StatusTag status={r.overall} /> : "—"}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </>
  );
}
