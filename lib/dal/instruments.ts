import "server-only";
import {
  findInstrumentsByRef, getInstrument, insertInstrument, listInstruments, listInstrumentsDueBy, listStationInstruments,
  replaceStationInstruments, retireInstrument, updateInstrument, type InstrumentValues,
} from "@/db/queries/instruments";
import { getStation } from "@/db/queries/stations";
import type { Instrument } from "@/db/schema";
import { HttpError } from "@/lib/auth/guards";
import { instrumentInputSchema, instrumentRefsSchema, normaliseRefs } from "@/lib/instruments/input-schemas";
import { addDays, calibrationStatus, DUE_SOON_DAYS, utcDay, type CalibrationStatus } from "@/lib/instruments/status";
import type { Actor } from "./actor";
import { InputError, parseFields } from "./setup-access";

// The instrument register: lab managers keep it; quality engineers read it (certificates, due dates);
// operators and clients are refused. Another lab's instrument answers 404 like a missing one.

type LabScope = { kind: "lab"; labId: string };

export function requireRegisterReader(actor: Actor): LabScope {
  if (actor.scope.kind !== "lab") throw new HttpError(403, "The instrument register is the lab's own");
  if (actor.role !== "admin" && actor.role !== "qa") throw new HttpError(403, "Only lab managers and quality engineers open the instrument register");
  return actor.scope;
}

export function requireRegisterEditor(actor: Actor): LabScope & { userId: string } {
  const scope = requireRegisterReader(actor);
  if (actor.role !== "admin" || !actor.userId) throw new HttpError(403, "Only lab managers change the instrument register");
  return { ...scope, userId: actor.userId };
}

export type InstrumentRow = Instrument & { status: CalibrationStatus };

const withStatus = (i: Instrument, today: string): InstrumentRow => ({ ...i, status: calibrationStatus(i, today) });

export async function listRegister(actor: Actor, options: { includeRetired?: boolean } = {}): Promise<InstrumentRow[]> {
  const scope = requireRegisterReader(actor);
  const today = utcDay(new Date());
  return (await listInstruments(scope.labId, options)).map((i) => withStatus(i, today));
}

export async function getRegisterEntry(actor: Actor, id: string): Promise<InstrumentRow> {
  const scope = requireRegisterReader(actor);
  const found = /^[0-9a-f-]{36}$/i.test(id) ? await getInstrument(scope.labId, id) : undefined;
  if (!found) throw new HttpError(404, "No such instrument");
  return withStatus(found, utcDay(new Date()));
}

function valuesOf(raw: unknown): InstrumentValues {
  const input = parseFields(instrumentInputSchema, raw, 400);
  return { ...input, spec: input.spec };
}

export async function createInstrument(actor: Actor, raw: unknown): Promise<Instrument> {
  const scope = requireRegisterEditor(actor);
  const values = valuesOf(raw);
  const row = await insertInstrument(scope.labId, scope.userId, values);
  if (!row) throw new InputError({ assetTag: `Asset tag ${values.assetTag} is already in the register` }, 409);
  return row;
}

export async function editInstrument(actor: Actor, id: string, raw: unknown): Promise<Instrument> {
  const scope = requireRegisterEditor(actor);
  const existing = await getRegisterEntry(actor, id);
  if (existing.retiredAt) throw new HttpError(409, "A retired instrument is kept as it was: register a new one");
  try {
    const row = await updateInstrument(scope.labId, id, valuesOf(raw));
    if (!row) throw new HttpError(404, "No such instrument");
    return row;
  } catch (err) {
    if ((err as { code?: string } | null)?.code === "23505") throw new InputError({ assetTag: "That asset tag is already in the register" }, 409);
    throw err;
  }
}

/** Retires an instrument; the captures that used it keep it on record. */
export async function retireRegisterEntry(actor: Actor, id: string): Promise<void> {
  const scope = requireRegisterEditor(actor);
  await getRegisterEntry(actor, id);
  if (!(await retireInstrument(scope.labId, id))) throw new HttpError(409, "This instrument is already retired");
}

/** Instruments due within DUE_SOON_DAYS (overdue ones first), for the lab manager's home page. */
export async function instrumentsDueSoon(actor: Actor): Promise<InstrumentRow[]> {
  if (actor.scope.kind !== "lab" || actor.role !== "admin") return [];
  const today = utcDay(new Date());
  return (await listInstrumentsDueBy(actor.scope.labId, addDays(today, DUE_SOON_DAYS))).map((i) => withStatus(i, today));
}

/**
 * Resolves ids or asset tags of the lab's instruments. An unknown one, a retired one or another lab's
 * is refused with `field` named (status 400).
 */
export async function resolveInstrumentRefs(labId: string, raw: unknown, field: string): Promise<{ instrumentId: string; channel: string }[]> {
  const parsed = instrumentRefsSchema.safeParse(raw);
  if (!parsed.success) throw new InputError({ [field]: parsed.error.issues[0]?.message ?? "instruments is a list of instrument ids or asset tags" }, 400);
  const refs = normaliseRefs(parsed.data);
  const found = await findInstrumentsByRef(labId, refs.map((r) => r.instrument));
  const out: { instrumentId: string; channel: string }[] = [];
  for (const [index, ref] of refs.entries()) {
    const key = ref.instrument.toLowerCase();
    const hit = found.find((i) => i.id.toLowerCase() === key || i.assetTag.toLowerCase() === key);
    if (!hit) throw new InputError({ [`${field}.${index}`]: `Unknown instrument "${ref.instrument}": give the id or asset tag of an instrument in this lab's register` }, 400);
    if (hit.retiredAt) throw new InputError({ [`${field}.${index}`]: `Instrument ${hit.assetTag} is retired: it cannot take new captures` }, 400);
    out.push({ instrumentId: hit.id, channel: ref.channel });
  }
  return out;
}

/** A bench's default instrument set (lab staff read it). */
export async function benchInstruments(actor: Actor, stationId: string) {
  if (actor.scope.kind !== "lab") throw new HttpError(403, "Benches belong to a lab");
  if (!(await getStation(actor.scope, stationId))) throw new HttpError(404, "No such bench in your lab");
  return listStationInstruments(actor.scope.labId, stationId);
}

/** Replaces a bench's default set; lab managers only. */
export async function setBenchInstruments(actor: Actor, stationId: string, raw: unknown): Promise<void> {
  const scope = requireRegisterEditor(actor);
  if (!(await getStation(scope, stationId))) throw new HttpError(404, "No such bench in your lab");
  await replaceStationInstruments(stationId, await resolveInstrumentRefs(scope.labId, raw, "instruments"));
}

/** The lab's instruments in service, as choices for a capture's instrument list (lab staff). */
export async function instrumentChoices(actor: Actor): Promise<{ id: string; label: string }[]> {
  if (actor.scope.kind !== "lab" || actor.role === "station") return [];
  return (await listInstruments(actor.scope.labId)).map((i) => ({ id: i.id, label: `${i.assetTag} · ${i.make} ${i.model}${i.calibrationDue ? ` (due ${i.calibrationDue})` : ""}` }));
}
