import { PageHeader } from "@/components/shell/page-header";
import { EmptyState } from "@/components/ui/empty-state";
import { requireRole } from "@/lib/auth/guards";
import { listProfilesView } from "@/lib/dal/import-profiles";
import { getStationsView } from "@/lib/dal/stations";
import { ImportProfiles } from "./_components/import-profiles";
import { NewKeyForm } from "./_components/new-key-form";
import { NewStationForm } from "./_components/new-station-form";
import { revokeKeyAction } from "./actions";
import { ConfirmButton } from "@/components/ui/confirm-button";

export const metadata = { title: "Benches" };

const day = (d: Date | null) => (d ? d.toISOString().slice(0, 10) : "—");

export default async function StationsPage() {
  const user = await requireRole("admin", "operator", "qa");
  const [view, profiles] = await Promise.all([getStationsView(), listProfilesView()]);
  return (
    <>
      <PageHeader title="Benches" lead="Test benches of the lab. A bench PC uploads through the bench API with a station key (see docs/bench-api.md)." />
      {view.stations.length === 0 ? <EmptyState title="No benches yet" /> : (
        <ul className="space-y-4">
          {view.stations.map((s) => (
            <li key={s.id} className="rounded-lg bg-white p-5 shadow-sm ring-1 ring-ink-200">
              <p className="font-semibold">{s.name}</p>
              <p className="text-sm text-ink-600">{s.location || "No location given"}</p>
              {view.isAdmin ? (
                s.keys.length === 0 ? <p className="mt-3 text-sm text-ink-600">No station keys.</p> : (
                  <table className="mt-3 min-w-full text-sm" aria-label={`Keys of ${s.name}`}>
                    <thead className="text-left text-xs uppercase tracking-wide text-ink-600">
                      <tr><th className="py-1 pr-4">Label</th><th className="py-1 pr-4">Prefix</th><th className="py-1 pr-4">Created</th><th className="py-1 pr-4">Last used</th><th className="py-1">Status</th></tr>
                    </thead>
                    <tbody>
                      {s.keys.map((k) => (
                        <tr key={k.id} className="border-t border-ink-100">
                          <td className="py-1 pr-4">{k.label}</td>
                          <td className="py-1 pr-4 font-mono">emk_{k.prefix}.…</td>
                          <td className="py-1 pr-4">{day(k.createdAt)} by {k.createdBy}</td>
                          <td className="py-1 pr-4">{day(k.lastUsedAt)}</td>
                          <td className="py-1">
                            {k.revokedAt ? <span className="text-outside-700">Revoked {day(k.revokedAt)}</span> : (
                              <form action={revokeKeyAction}>
                                <input type="hidden" name="keyId" value={k.id} />
                                <ConfirmButton label="Revoke" question={`Revoke key ${k.label}? The bench PC using it is refused from then on.`} confirmLabel="Yes, revoke" />
                              </form>
                            )}
                          </td>
                        </tr>
                      ))}
                    </tbody>
                  </table>
                )
              ) : null}
              <ImportProfiles stationName={s.name} profiles={profiles.filter((p) => p.stationId === s.id)} canEdit={user.role !== "qa"} />
            </li>
          ))}
        </ul>
      )}
      {view.isAdmin ? (
        <section className="mt-8 space-y-4">
          <h2 className="text-lg font-semibold">New station key</h2>
          <NewKeyForm stations={view.stations.map((s) => ({ id: s.id, name: s.name }))} />
          <h2 className="text-lg font-semibold">New bench</h2>
          <NewStationForm />
        </section>
      ) : null}
    </>
  );
}
