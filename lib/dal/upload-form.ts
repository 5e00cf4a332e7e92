import "server-only";
import { listInstruments, listStationSets } from "@/db/queries/instruments";
import { listStations } from "@/db/queries/stations";
import { listRatingsForRegistration, listUnits } from "@/db/queries/units";
import { requireRole } from "@/lib/auth/guards";
import { getEnv } from "@/lib/server/env";
import { scopeFor } from "./scope";

/** What the upload form offers: the lab's units, ratings for new units, benches, and the size limit. */
export async function getUploadFormOptions() {
  const user = await requireRole("admin", "operator");
  const scope = scopeFor(user);
  const [units, ratings, stations] = await Promise.all([listUnits(scope, { limit: 1000 }), listRatingsForRegistration(scope), listStations(scope)]);
  const [instruments, sets] = scope.kind === "lab" ? await Promise.all([listInstruments(scope.labId), listStationSets(scope.labId)]) : [[], []];
  return {
    units: units.map((u) => ({ serial: u.serial, modelCode: u.modelCode })),
    ratings: ratings.map((r) => ({ id: r.id, label: `${r.modelCode} · ${r.title} (${r.owner})` })),
    stations: stations.map((s) => ({ id: s.id, name: s.name })),
    maxBytes: getEnv().UPLOAD_MAX_BYTES,
    instrumentOptions: {
      instruments: instruments.map((i) => ({ id: i.id, label: `${i.assetTag} · ${i.make} ${i.model}${i.calibrationDue ? ` (due ${i.calibrationDue})` : ""}` })),
      benchSets: Object.fromEntries(sets.map((s) => [s.id, s.instrumentIds])),
    },
  };
}
