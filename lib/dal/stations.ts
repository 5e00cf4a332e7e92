import "server-only";
import { insertStationKey, listStationKeys, revokeStationKey } from "@/db/queries/station-keys";
import { getStation, insertStation, listStations } from "@/db/queries/stations";
import { HttpError, requireRole } from "@/lib/auth/guards";
import { generateStationKey } from "@/lib/server/hash";
import { scopeFor } from "./scope";

/** Benches of the viewer's lab; their keys (prefix and label only, never a secret) for lab managers. */
export async function getStationsView() {
  const user = await requireRole("admin", "operator", "qa");
  const scope = scopeFor(user);
  const isAdmin = user.role === "admin";
  const [stations, keys] = await Promise.all([listStations(scope), isAdmin ? listStationKeys(scope) : Promise.resolve([])]);
  return {
    isAdmin,
    stations: stations.map((s) => ({ ...s, keys: keys.filter((k) => k.stationId === s.id) })),
  };
}

/** Creates a key for a bench of the admin's lab; the token is returned once and never stored. */
export async function createStationKey(input: { stationId: string; label: string }): Promise<{ token: string; stationName: string }> {
  const admin = await requireRole("admin");
  const scope = scopeFor(admin);
  const station = await getStation(scope, input.stationId);
  if (!station) throw new HttpError(404, "No such bench in your lab");
  const key = generateStationKey();
  await insertStationKey({ stationId: station.id, prefix: key.prefix, secretHash: key.secretHash, label: input.label, createdById: admin.id });
  return { token: key.token, stationName: station.name };
}

export async function revokeKey(keyId: string): Promise<boolean> {
  const admin = await requireRole("admin");
  return revokeStationKey(scopeFor(admin), keyId);
}

export async function createStation(input: { name: string; location: string }) {
  const admin = await requireRole("admin");
  const scope = scopeFor(admin);
  if (scope.kind !== "lab") throw new HttpError(403, "Benches belong to a lab");
  return insertStation(scope, input);
}
