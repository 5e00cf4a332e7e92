import { and, desc, eq, inArray, isNull } from "drizzle-orm";
import { getDb } from "@/db/client";
import { stationKeys, stations, users } from "@/db/schema";
import type { Scope } from "./scope";

export async function listStationKeys(scope: Scope) {
  if (scope.kind !== "lab") return [];
  return getDb()
    .select({
      id: stationKeys.id, stationId: stationKeys.stationId, prefix: stationKeys.prefix, label: stationKeys.label,
      createdBy: users.name, revokedAt: stationKeys.revokedAt, lastUsedAt: stationKeys.lastUsedAt, createdAt: stationKeys.createdAt,
    })
    .from(stationKeys)
    .innerJoin(stations, eq(stations.id, stationKeys.stationId))
    .innerJoin(users, eq(users.id, stationKeys.createdById))
    .where(eq(stations.labId, scope.labId))
    .orderBy(desc(stationKeys.createdAt));
}

export async function insertStationKey(values: { stationId: string; prefix: string; secretHash: string; label: string; createdById: string }) {
  const rows = await getDb().insert(stationKeys).values(values).returning({ id: stationKeys.id });
  return rows[0];
}

/** Revokes a key of a bench in the scope's lab; false when there is no such live key. */
export async function revokeStationKey(scope: Scope, keyId: string): Promise<boolean> {
  if (scope.kind !== "lab") return false;
  const owned = getDb().select({ id: stations.id }).from(stations).where(eq(stations.labId, scope.labId));
  const rows = await getDb()
    .update(stationKeys)
    .set({ revokedAt: new Date() })
    .where(and(eq(stationKeys.id, keyId), isNull(stationKeys.revokedAt), inArray(stationKeys.stationId, owned)))
    .returning({ id: stationKeys.id });
  return rows.length > 0;
}

/** For bench API authentication: the key by its public prefix, with its bench's lab. */
export async function findStationKeyByPrefix(prefix: string) {
  const rows = await getDb()
    .select({ key: stationKeys, labId: stations.labId, stationName: stations.name })
    .from(stationKeys)
    .innerJoin(stations, eq(stations.id, stationKeys.stationId))
    .where(eq(stationKeys.prefix, prefix))
    .limit(1);
  return rows[0];
}

export async function touchStationKey(keyId: string): Promise<void> {
  await getDb().update(stationKeys).set({ lastUsedAt: new Date() }).where(eq(stationKeys.id, keyId));
}
