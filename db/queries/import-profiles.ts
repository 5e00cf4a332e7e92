import { and, asc, eq, inArray } from "drizzle-orm";
import { getDb } from "@/db/client";
import { captures, importProfiles, stations, type ImportProfile } from "@/db/schema";
import type { Scope } from "./scope";

// A bench's import profiles; every statement is limited to benches of the caller's lab.

function labStations(labId: string) {
  return getDb().select({ id: stations.id }).from(stations).where(eq(stations.labId, labId));
}

export async function listImportProfiles(scope: Scope): Promise<ImportProfile[]> {
  if (scope.kind !== "lab") return [];
  return getDb().select().from(importProfiles).where(inArray(importProfiles.stationId, labStations(scope.labId))).orderBy(asc(importProfiles.headerPreview));
}

export async function getImportProfile(scope: Scope, stationId: string, signature: string): Promise<ImportProfile | undefined> {
  if (scope.kind !== "lab") return undefined;
  const rows = await getDb()
    .select({ profile: importProfiles })
    .from(importProfiles)
    .innerJoin(stations, eq(stations.id, importProfiles.stationId))
    .where(and(eq(importProfiles.stationId, stationId), eq(importProfiles.headerSignature, signature), eq(stations.labId, scope.labId)))
    .limit(1);
  return rows[0]?.profile;
}

/** Keeps the latest confirmed settings for a header on a bench (one row per bench and header). */
export async function upsertImportProfile(
  scope: Scope & { kind: "lab" },
  values: { stationId: string; headerSignature: string; headerPreview: string; settings: Record<string, unknown>; updatedById: string | null },
): Promise<void> {
  const owned = await getDb().select({ id: stations.id }).from(stations).where(and(eq(stations.id, values.stationId), eq(stations.labId, scope.labId))).limit(1);
  if (!owned[0]) return;
  await getDb()
    .insert(importProfiles)
    .values(values)
    .onConflictDoUpdate({
      target: [importProfiles.stationId, importProfiles.headerSignature],
      set: { settings: values.settings, headerPreview: values.headerPreview, updatedById: values.updatedById, updatedAt: new Date() },
    });
}

export async function updateImportProfileSettings(scope: Scope & { kind: "lab" }, id: string, settings: Record<string, unknown>, updatedById: string): Promise<boolean> {
  const rows = await getDb()
    .update(importProfiles)
    .set({ settings, updatedById, updatedAt: new Date() })
    .where(and(eq(importProfiles.id, id), inArray(importProfiles.stationId, labStations(scope.labId))))
    .returning({ id: importProfiles.id });
  return rows.length > 0;
}

export async function deleteImportProfile(scope: Scope & { kind: "lab" }, id: string): Promise<boolean> {
  const rows = await getDb()
    .delete(importProfiles)
    .where(and(eq(importProfiles.id, id), inArray(importProfiles.stationId, labStations(scope.labId))))
    .returning({ id: importProfiles.id });
  return rows.length > 0;
}

/** Writes a profile's settings onto a capture still uploading that names no roles (bench API files). */
export async function applyImportSettings(
  scope: Scope & { kind: "lab" },
  captureId: string,
  settings: { channelRoles: Record<string, string>; probeScales: Record<string, number>; channelOffsets: Record<string, number>; sampleRateHz: number | null },
): Promise<void> {
  await getDb().update(captures).set({ ...settings, updatedAt: new Date() }).where(and(eq(captures.id, captureId), eq(captures.labId, scope.labId), eq(captures.state, "uploading")));
}
