import { ProfileForm } from "@/components/ratings/profile-form";
import type { ToleranceProfile } from "@/lib/analysis";
import { saveProfileAction } from "../../actions";

type Row = { id: string; label: string; required: boolean; band: string; source: string | null; reason: string | null };
type Version = { id: string; version: number; reason: string; createdAt: Date; author: string; changes: string[]; rows: Row[]; profile: ToleranceProfile | null };

const when = (d: Date) => `${d.toISOString().slice(0, 16).replace("T", " ")} UTC`;

/** The profile in force as a table per check, the edit form, and every version with what changed. */
export function ProfileSection({ ratingId, inForce, versions, canEdit }: { ratingId: string; inForce: Version | null; versions: Version[]; canEdit: boolean }) {
  return (
    <section className="mt-8" aria-label="Tolerance profile">
      <h2 className="mb-1 text-lg font-semibold">Tolerance profile {inForce ? `— version ${inForce.version} in force` : ""}</h2>
      {!inForce ? <p className="text-sm text-ink-600">No profile: captures of this rating cannot be judged.</p> : (
        <>
          <p className="mb-3 text-sm text-ink-600">{inForce.profile?.label} · marginal zone {inForce.profile?.marginalZonePercent} % · harmonics to order {inForce.profile?.harmonicOrder} · plausibility factor {inForce.profile?.plausibilityFactor}× · {inForce.profile?.decisionRule === "guarded" ? "guarded acceptance (w = U)" : "simple acceptance"}</p>
          <table className="min-w-full bg-white text-sm shadow-sm ring-1 ring-ink-200" aria-label="Profile in force">
            <thead className="text-left text-xs uppercase tracking-wide text-ink-600"><tr><th className="px-3 py-2">Check</th><th className="px-3 py-2">Band</th><th className="px-3 py-2">Source</th></tr></thead>
            <tbody>
              {inForce.rows.map((r) => (
                <tr key={r.id} className="border-t border-ink-100">
                  <td className="px-3 py-2 font-semibold">{r.label}</td>
                  <td className="px-3 py-2">{r.band}</td>
                  <td className="px-3 py-2">{r.required ? r.source : `Not required: ${r.reason}`}</td>
                </tr>
              ))}
            </tbody>
          </table>
          {canEdit && inForce.profile ? (
            <details className="mt-4">
              <summary className="cursor-pointer text-sm font-semibold text-copper-700">Edit the profile (saves a new version)</summary>
              <div className="mt-3"><ProfileForm action={saveProfileAction} ratingId={ratingId} profile={inForce.profile} /></div>
            </details>
          ) : null}
        </>
      )}
      <h3 className="mb-2 mt-6 font-semibold">Version history</h3>
      <ol className="space-y-2 text-sm" aria-label="Profile versions">
        {versions.map((v) => (
          <li key={v.id} className="rounded-md bg-white p-3 ring-1 ring-ink-200">
            <p><span className="font-semibold">Version {v.version}</span> · {when(v.createdAt)} · {v.author}</p>
            <p>Why: {v.reason}</p>
            <ul className="ml-5 list-disc text-ink-600">{v.changes.map((c) => <li key={c}>{c}</li>)}</ul>
          </li>
        ))}
      </ol>
    </section>
  );
}
