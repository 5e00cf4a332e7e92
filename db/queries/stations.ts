import { and, asc, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { stations, type Station } from "@/db/schema";
import type { Scope } from "./scope";

// Benches belong to a lab; a client organisation has none to see.

export async function listStations(scope: Scope): Promise<Station[]> {
  if (scope.kind !== "lab") return [];
  return getDb().select().from(stations).where(eq(stations.labId, scope.labId)).orderBy(asc(stations.name));
}

export async function getStation(scope: Scope, stationId: string): Promise<Station | undefined> {
  if (scope.kind !== "lab") return undefined;
  const rows = await getDb().select().from(stations).where(and(eq(stations.id, stationId), eq(stations.labId, scope.labId))).limit(1);
  return rows[0];
}

export async function insertStation(scope: Scope & { kind: "lab" }, values: { name: string; location: string }): Promise<Station> {
  const rows = await getDb().insert(stations).values({ ...values, labId: scope.labId }).returning();
  const row = rows[0];
  if (!row) throw new Error("station insert returned nothing");
  return row;
}
