import { requirePageActor } from "@/lib/dal/actor";
import { getReleasePanelView } from "@/lib/dal/report-files";
import { ReleaseForm, SupersedeForm, WithdrawForm } from "./release-forms";

const STATUS_WORDS = { valid: "Valid", superseded: "Superseded", withdrawn: "Withdrawn" } as Record<string, string>;

/** The unit's released reports and, for quality engineers and lab managers, release, new revision and withdrawal. */
export async function ReleasePanel({ unitId }: { unitId: string }) {
  const view = await getReleasePanelView(await requirePageActor(), unitId);
  if (!view) return null;
  const latest = view.revisions[0];
  return (
    <section aria-labelledby="released-reports" className="mt-6 rounded-lg bg-white p-5 shadow-sm ring-1 ring-ink-200">
      <h2 id="released-reports" className="mb-1 font-semibold">Released reports</h2>
      <p className="mb-3 text-sm text-ink-600">
        A released report is rendered once, numbered and stored; downloads serve that file. The draft above is for the lab only.
      </p>
      {view.revisions.length === 0 ? <p className="text-sm text-ink-600">No report released for this unit yet.</p> : (
        <table className="w-full text-left text-sm">
          <thead className="text-ink-600"><tr><th className="py-1 pr-3">Number</th><th className="py-1 pr-3">Revision</th><th className="py-1 pr-3">Released</th><th className="py-1 pr-3">Status</th><th className="py-1">File</th></tr></thead>
          <tbody>
            {view.revisions.map((r) => (
              <tr key={r.id} className="border-t border-ink-100 align-top" data-testid={`report-revision-${r.revision}`}>
                <td className="py-2 pr-3 font-mono"><a href={`/verify/${encodeURIComponent(r.number)}`}>{r.number}</a></td>
                <td className="py-2 pr-3">{r.revision}{r.reason ? <span className="block text-xs text-ink-600">{r.reason}</span> : null}</td>
                <td className="py-2 pr-3">{r.releasedAt.slice(0, 16).replace("T", " ")} UTC</td>
                <td className="py-2 pr-3 font-semibold">{STATUS_WORDS[r.status] ?? r.status}{r.withdrawReason ? <span className="block text-xs font-normal text-ink-600">{r.withdrawReason}</span> : null}</td>
                <td className="py-2"><a href={`/api/reports/${r.id}/pdf`}>PDF, {r.pageCount} page{r.pageCount === 1 ? "" : "s"}</a></td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      {view.canSign ? (
        <div className="mt-4 grid gap-6 md:grid-cols-2">
          {view.missingSteps.length > 0 && view.disposition !== "accepted-with-concession" ? (
            <p className="text-sm text-ink-700 md:col-span-2">Not releasable yet; no capture of record for: {view.missingSteps.join("; ")}.</p>
          ) : null}
          {view.disposition === "scrapped" ? <p className="text-sm text-ink-700 md:col-span-2">The unit is scrapped: it gets no report.</p> : null}
          {!latest ? <ReleaseForm unitId={unitId} /> : <SupersedeForm unitId={unitId} number={latest.number} />}
          {latest?.status === "valid" ? <WithdrawForm unitId={unitId} number={latest.number} revision={latest.revision} /> : null}
        </div>
      ) : null}
    </section>
  );
}
