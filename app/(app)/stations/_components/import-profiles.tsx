"use client";

import { useActionState } from "react";
import type { ImportProfileSettings } from "@/lib/captures/import-profile";
import { editProfileAction, removeProfileAction, type ProfileState } from "../profile-actions";

type Profile = { id: string; headerPreview: string; updatedAt: string; settings: ImportProfileSettings };

function describe(settings: ImportProfileSettings): string {
  const channels = Object.entries(settings.channelRoles).map(([ch, role]) => {
    const extra = [settings.probeScales[ch] !== undefined ? `×${settings.probeScales[ch]}` : "", settings.channelOffsets[ch] !== undefined ? `${settings.channelOffsets[ch]! >= 0 ? "+" : ""}${settings.channelOffsets[ch]}` : ""].filter(Boolean).join(" ");
    return `${ch} → ${role}${extra ? ` (${extra})` : ""}`;
  });
  return [...channels, settings.sampleRateHz !== null ? `${settings.sampleRateHz} Hz` : ""].filter(Boolean).join("; ");
}

function ProfileRow({ profile, canEdit }: { profile: Profile; canEdit: boolean }) {
  const [state, action, pending] = useActionState<ProfileState, FormData>(editProfileAction, { ok: true, message: "" });
  return (
    <li data-testid="import-profile" className="border-t border-ink-100 py-2 text-sm">
      <p className="font-mono text-xs">{profile.headerPreview}</p>
      <p>{describe(profile.settings) || "No settings"} <span className="text-ink-600">· saved {profile.updatedAt.slice(0, 10)}</span></p>
      {canEdit ? (
        <div className="mt-1 flex flex-wrap items-start gap-4">
          <details>
            <summary className="cursor-pointer font-semibold">Edit</summary>
            <form action={action} className="mt-2 space-y-2">
              <input type="hidden" name="profileId" value={profile.id} />
              <label className="block text-xs text-ink-600" htmlFor={`settings-${profile.id}`}>
                Settings: channelRoles, probeScales, channelOffsets (V or A) by column header, sampleRateHz (Hz or null)
              </label>
              <textarea id={`settings-${profile.id}`} name="settings" rows={6} defaultValue={JSON.stringify(profile.settings, null, 1)} className="w-full max-w-xl rounded border border-ink-200 p-2 font-mono text-xs" />
              <button type="submit" disabled={pending} className="rounded bg-ink-900 px-3 py-1 text-xs font-semibold text-white">Save profile</button>
              {state.message ? <p role="status" className={state.ok ? "text-ink-600" : "font-semibold text-outside-700"}>{state.message}</p> : null}
            </form>
          </details>
          <form action={removeProfileAction}>
            <input type="hidden" name="profileId" value={profile.id} />
            <button type="submit" className="font-semibold text-outside-700">Remove</button>
          </form>
        </div>
      ) : null}
    </li>
  );
}

/** A bench's import profiles: the settings confirmed for each header layout, pre-filled on the next upload. */
export function ImportProfiles({ stationName, profiles, canEdit }: { stationName: string; profiles: Profile[]; canEdit: boolean }) {
  if (profiles.length === 0) return <p className="mt-3 text-sm text-ink-600">No import profiles yet: confirming a file&apos;s channels on upload keeps them for its header.</p>;
  return (
    <section className="mt-3" aria-label={`Import profiles of ${stationName}`}>
      <h3 className="text-sm font-semibold">Import profiles</h3>
      <ul>{profiles.map((p) => <ProfileRow key={p.id} profile={p} canEdit={canEdit} />)}</ul>
    </section>
  );
}
