import "server-only";
import { listInstrumentCertificates, listStationSets } from "@/db/queries/instruments";
import type { Actor } from "./actor";
import { getRegisterEntry, listRegister, requireRegisterReader } from "./instruments";

// View-shaped reads for the register's pages.

export async function getRegisterPageView(actor: Actor) {
  const scope = requireRegisterReader(actor);
  const all = await listRegister(actor, { includeRetired: true });
  const canEdit = actor.role === "admin";
  return {
    canEdit,
    instruments: all.filter((i) => !i.retiredAt),
    retired: all.filter((i) => i.retiredAt),
    benches: canEdit ? await listStationSets(scope.labId) : [],
  };
}

export async function getInstrumentPageView(actor: Actor, id: string) {
  const scope = requireRegisterReader(actor);
  const instrument = await getRegisterEntry(actor, id);
  const [certificates, sets] = await Promise.all([listInstrumentCertificates(instrument.id), listStationSets(scope.labId)]);
  return {
    instrument, certificates, canEdit: actor.role === "admin",
    benches: sets.filter((s) => s.instrumentIds.includes(instrument.id)).map((s) => s.name),
  };
}
