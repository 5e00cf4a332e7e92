import "server-only";
import { applyImportSettings, deleteImportProfile, getImportProfile, listImportProfiles, updateImportProfileSettings, upsertImportProfile } from "@/db/queries/import-profiles";
import type { Capture } from "@/db/schema";
import { headerSignature, type SniffedHeader } from "@/lib/analysis";
import { HttpError, requireRole } from "@/lib/auth/guards";
import { hasSettings, importProfileSettingsSchema, type ImportProfileSettings } from "@/lib/captures/import-profile";
import { requireUploader, type Actor } from "./actor";
import { scopeFor } from "./scope";

/** Stored settings read through the schema (a row written by an older version still parses). */
function readSettings(raw: unknown): ImportProfileSettings {
  const parsed = importProfileSettingsSchema.safeParse(raw);
  return parsed.success ? parsed.data : importProfileSettingsSchema.parse({});
}

/** The bench's profile for a header, for pre-filling the upload form; null when there is none. */
export async function importProfileFor(actor: Actor, stationId: string, signature: string) {
  const scope = requireUploader(actor);
  const profile = await getImportProfile(scope, stationId, signature);
  if (!profile) return null;
  return { id: profile.id, headerPreview: profile.headerPreview, updatedAt: profile.updatedAt.toISOString(), settings: readSettings(profile.settings) };
}

/**
 * At completion, with the stored file's header: a capture that names no roles takes its bench's
 * profile for that header (what the bench API relies on); one an operator confirmed in the browser
 * becomes the bench's profile for that header.
 */
export async function rememberOrApplyProfile(actor: Actor, capture: Capture, sniffed: SniffedHeader): Promise<void> {
  if (!capture.stationId) return;
  const scope = requireUploader(actor);
  const { signature, preview } = headerSignature(sniffed);
  const confirmed: ImportProfileSettings = {
    channelRoles: capture.channelRoles as ImportProfileSettings["channelRoles"],
    probeScales: capture.probeScales, channelOffsets: capture.channelOffsets, sampleRateHz: capture.sampleRateHz,
  };
  if (Object.keys(confirmed.channelRoles).length === 0) {
    const profile = await getImportProfile(scope, capture.stationId, signature);
    if (profile) {
      const settings = readSettings(profile.settings);
      await applyImportSettings(scope, capture.id, {
        channelRoles: settings.channelRoles,
        probeScales: Object.keys(confirmed.probeScales).length > 0 ? confirmed.probeScales : settings.probeScales,
        channelOffsets: Object.keys(confirmed.channelOffsets).length > 0 ? confirmed.channelOffsets : settings.channelOffsets,
        sampleRateHz: confirmed.sampleRateHz ?? settings.sampleRateHz,
      });
    }
    return;
  }
  // Only a person confirms a profile; a station key's registration applies one but never writes it.
  if (actor.userId === null || actor.stationKeyId !== null || !hasSettings(confirmed)) return;
  await upsertImportProfile(scope, { stationId: capture.stationId, headerSignature: signature, headerPreview: preview, settings: confirmed, updatedById: actor.userId });
}

/** Profiles of the lab's benches, for the bench page. */
export async function listProfilesView() {
  const user = await requireRole("admin", "operator", "qa");
  const rows = await listImportProfiles(scopeFor(user));
  return rows.map((row) => ({ id: row.id, stationId: row.stationId, headerPreview: row.headerPreview, updatedAt: row.updatedAt.toISOString(), settings: readSettings(row.settings) }));
}

async function labEditor() {
  const user = await requireRole("admin", "operator");
  const scope = scopeFor(user);
  if (scope.kind !== "lab") throw new HttpError(403, "Import profiles belong to a lab's benches");
  return { user, scope };
}

export async function editImportProfile(profileId: string, settings: ImportProfileSettings): Promise<void> {
  const { user, scope } = await labEditor();
  if (!(await updateImportProfileSettings(scope, profileId, settings, user.id))) throw new HttpError(404, "No such import profile");
}

export async function removeImportProfile(profileId: string): Promise<void> {
  const { scope } = await labEditor();
  if (!(await deleteImportProfile(scope, profileId))) throw new HttpError(404, "No such import profile");
}
