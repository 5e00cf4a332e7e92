import { and, asc, eq, inArray, isNull, sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import {
  captureInstruments, captures, instrumentCertificates, instruments, overdueConfirmations, stationInstruments, stations, units, users,
  type Instrument, type InstrumentSpec,
} from "@/db/schema";
import { unitScopeWhere, type Scope } from "./scope";

// The instrument register of a lab, bench default sets and the instruments each capture was taken with.
// Every read takes the lab's id: another lab's instrument is as missing as an unknown one.

export type InstrumentValues = {
  kind: Instrument["kind"]; make: string; model: string; serial: string; assetTag: string; spec: InstrumentSpec;
  calibratedOn: string | null; calibrationDue: string | null; calibrationNote: string;
};

export async function listInstruments(labId: string, options: { includeRetired?: boolean } = {}): Promise<Instrument[]> {
  const where = options.includeRetired ? eq(instruments.labId, labId) : and(eq(instruments.labId, labId), isNull(instruments.retiredAt));
  return getDb().select().from(instruments).where(where).orderBy(asc(instruments.kind), asc(instruments.assetTag));
}

export async function getInstrument(labId: string, id: string): Promise<Instrument | undefined> {
  const rows = await getDb().select().from(instruments).where(and(eq(instruments.labId, labId), eq(instruments.id, id))).limit(1);
  return rows[0];
}

/** The lab's instruments named by id or by asset tag (case-insensitive), retired ones included. */
export async function findInstrumentsByRef(labId: string, refs: readonly string[]): Promise<Instrument[]> {
  if (refs.length === 0) return [];
  const uuids = refs.filter((r) => /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i.test(r));
  const tags = refs.map((r) => r.toLowerCase());
  const byTag = sql`lower(${instruments.assetTag}) in (${sql.join(tags.map((t) => sql`${t}`), sql`, `)})`;
  const where = uuids.length > 0 ? sql`(${inArray(instruments.id, uuids)} or ${byTag})` : byTag;
  return getDb().select().from(instruments).where(and(eq(instruments.labId, labId), where));
}

/** Inserts an instrument; null when the lab already has that asset tag. */
export async function insertInstrument(labId: string, createdById: string, values: InstrumentValues): Promise<Instrument | null> {
  const rows = await getDb().insert(instruments).values({ ...values, labId, createdById }).onConflictDoNothing().returning();
  return rows[0] ?? null;
}

export async function updateInstrument(labId: string, id: string, values: InstrumentValues): Promise<Instrument | null> {
  const rows = await getDb().update(instruments).set({ ...values, updatedAt: new Date() }).where(and(eq(instruments.labId, labId), eq(instruments.id, id))).returning();
  return rows[0] ?? null;
}

/** Retires an instrument: it leaves the register's lists and bench sets, and stays on its captures. */
export async function retireInstrument(labId: string, id: string): Promise<boolean> {
  return getDb().transaction(async (tx) => {
    const rows = await tx.update(instruments).set({ retiredAt: new Date(), updatedAt: new Date() })
      .where(and(eq(instruments.labId, labId), eq(instruments.id, id), isNull(instruments.retiredAt))).returning({ id: instruments.id });
    if (rows.length === 0) return false;
    await tx.delete(stationInstruments).where(eq(stationInstruments.instrumentId, id));
    return true;
  });
}

/** Instruments not retired whose due date is on or before `until` (YYYY-MM-DD), soonest first. */
export async function listInstrumentsDueBy(labId: string | null, until: string): Promise<Instrument[]> {
  const where = and(isNull(instruments.retiredAt), sql`${instruments.calibrationDue} <= ${until}::date`, labId ? eq(instruments.labId, labId) : undefined);
  return getDb().select().from(instruments).where(where).orderBy(asc(instruments.calibrationDue));
}

/** The lab's enabled lab managers (who receive due-date reminders). */
export async function listLabManagers(labId: string): Promise<{ id: string; email: string; name: string }[]> {
  return getDb().select({ id: users.id, email: users.email, name: users.name }).from(users)
    .where(and(eq(users.organisationId, labId), eq(users.role, "admin"), isNull(users.disabledAt)));
}

export type InstrumentOnCapture = { instrument: Instrument; channel: string };

export async function listStationInstruments(labId: string, stationId: string): Promise<InstrumentOnCapture[]> {
  return getDb().select({ instrument: instruments, channel: stationInstruments.channel }).from(stationInstruments)
    .innerJoin(instruments, eq(instruments.id, stationInstruments.instrumentId))
    .innerJoin(stations, eq(stations.id, stationInstruments.stationId))
    .where(and(eq(stationInstruments.stationId, stationId), eq(stations.labId, labId), eq(instruments.labId, labId)))
    .orderBy(asc(instruments.kind), asc(instruments.assetTag));
}

/** Replaces a bench's default set (the caller checked the bench and the instruments belong to the lab). */
export async function replaceStationInstruments(stationId: string, rows: readonly { instrumentId: string; channel: string }[]): Promise<void> {
  await getDb().transaction(async (tx) => {
    await tx.delete(stationInstruments).where(eq(stationInstruments.stationId, stationId));
    if (rows.length > 0) await tx.insert(stationInstruments).values(rows.map((r) => ({ ...r, stationId }))).onConflictDoNothing();
  });
}

export async function listCaptureInstruments(captureId: string): Promise<InstrumentOnCapture[]> {
  return getDb().select({ instrument: instruments, channel: captureInstruments.channel }).from(captureInstruments)
    .innerJoin(instruments, eq(instruments.id, captureInstruments.instrumentId))
    .where(eq(captureInstruments.captureId, captureId)).orderBy(asc(instruments.kind), asc(instruments.assetTag));
}

/** Replaces the instruments recorded for a capture (the caller checked the capture's scope). */
export async function replaceCaptureInstruments(captureId: string, rows: readonly { instrumentId: string; channel: string }[]): Promise<void> {
  await getDb().transaction(async (tx) => {
    await tx.delete(captureInstruments).where(eq(captureInstruments.captureId, captureId));
    if (rows.length > 0) await tx.insert(captureInstruments).values(rows.map((r) => ({ ...r, captureId }))).onConflictDoNothing();
  });
}

/** Copies the bench's default set onto a capture that has none recorded yet. */
export async function copyStationInstrumentsOnce(stationId: string, captureId: string): Promise<void> {
  await getDb().execute(sql`
    insert into ${captureInstruments} (capture_id, instrument_id, channel)
    select ${captureId}, si.instrument_id, si.channel from ${stationInstruments} si
    where si.station_id = ${stationId}
      and not exists (select 1 from ${captureInstruments} ci where ci.capture_id = ${captureId})
    on conflict do nothing`);
}

/** Upload day (UTC) of a capture: its completed upload, else its registration. */
const uploadDay = sql`(coalesce(${captures.uploadedAt}, ${captures.createdAt}) at time zone 'UTC')::date`;

export type OverdueCapture = {
  captureId: string; originalName: string; uploadedOn: string;
  instruments: { assetTag: string; calibrationDue: string }[];
  confirmation: { reason: string; confirmedById: string; createdAt: Date } | null;
};

/** Captures of a unit taken with an instrument past its calibration due date, with their confirmation if any. */
export async function overdueCapturesOfUnit(scope: Scope, unitId: string): Promise<OverdueCapture[]> {
  const rows = await getDb()
    .select({
      captureId: captures.id, originalName: captures.originalName, uploadedOn: sql<string>`${uploadDay}::text`,
      assetTag: instruments.assetTag, calibrationDue: instruments.calibrationDue,
      reason: overdueConfirmations.reason, confirmedById: overdueConfirmations.confirmedById, confirmedAt: overdueConfirmations.createdAt,
    })
    .from(captures)
    .innerJoin(units, eq(units.id, captures.unitId))
    .innerJoin(captureInstruments, eq(captureInstruments.captureId, captures.id))
    .innerJoin(instruments, eq(instruments.id, captureInstruments.instrumentId))
    .leftJoin(overdueConfirmations, eq(overdueConfirmations.captureId, captures.id))
    .where(and(unitScopeWhere(scope), eq(captures.unitId, unitId), sql`${instruments.calibrationDue} < ${uploadDay}`))
    .orderBy(asc(captures.createdAt), asc(instruments.assetTag));
  const byCapture = new Map<string, OverdueCapture>();
  for (const r of rows) {
    const entry = byCapture.get(r.captureId) ?? {
      captureId: r.captureId, originalName: r.originalName, uploadedOn: r.uploadedOn, instruments: [],
      confirmation: r.reason !== null && r.confirmedById !== null && r.confirmedAt !== null ? { reason: r.reason, confirmedById: r.confirmedById, createdAt: r.confirmedAt } : null,
    };
    entry.instruments.push({ assetTag: r.assetTag, calibrationDue: r.calibrationDue as string });
    byCapture.set(r.captureId, entry);
  }
  return [...byCapture.values()];
}

/** Records a confirmation once; false when the capture already has one. */
export async function insertOverdueConfirmation(values: { captureId: string; reason: string; confirmedById: string; signatureId: string }): Promise<boolean> {
  const rows = await getDb().insert(overdueConfirmations).values(values).onConflictDoNothing().returning({ id: overdueConfirmations.captureId });
  return rows.length > 0;
}

/** Records a stored certificate once per file key; returns its id. */
export async function insertInstrumentCertificate(values: typeof instrumentCertificates.$inferInsert): Promise<string> {
  const rows = await getDb().insert(instrumentCertificates).values(values).onConflictDoNothing().returning({ id: instrumentCertificates.id });
  if (rows[0]) return rows[0].id;
  const again = await getDb().select({ id: instrumentCertificates.id }).from(instrumentCertificates).where(eq(instrumentCertificates.fileKey, values.fileKey)).limit(1);
  if (!again[0]) throw new Error("certificate insert returned nothing");
  return again[0].id;
}

export async function listInstrumentCertificates(instrumentId: string) {
  return getDb().select().from(instrumentCertificates).where(eq(instrumentCertificates.instrumentId, instrumentId)).orderBy(asc(instrumentCertificates.createdAt));
}

/** Whether the unit exists in the caller's scope (another organisation's answers false, like a missing one). */
export async function unitInScope(scope: Scope, unitId: string): Promise<boolean> {
  const rows = await getDb().select({ id: units.id }).from(units).where(and(eq(units.id, unitId), unitScopeWhere(scope))).limit(1);
  return rows.length > 0;
}

/** Instruments not retired, of every lab, whose due date lies in [from, until] (YYYY-MM-DD), with their lab's name. */
export async function listInstrumentsDueBetween(from: string, until: string) {
  return getDb().select({ instrument: instruments }).from(instruments)
    .where(and(isNull(instruments.retiredAt), sql`${instruments.calibrationDue} between ${from}::date and ${until}::date`))
    .orderBy(asc(instruments.calibrationDue));
}

/** Every bench of the lab with the ids of its default set. */
export async function listStationSets(labId: string): Promise<{ id: string; name: string; instrumentIds: string[] }[]> {
  const rows = await getDb().select({ id: stations.id, name: stations.name, instrumentId: stationInstruments.instrumentId }).from(stations)
    .leftJoin(stationInstruments, eq(stationInstruments.stationId, stations.id))
    .where(eq(stations.labId, labId)).orderBy(asc(stations.name));
  const out = new Map<string, { id: string; name: string; instrumentIds: string[] }>();
  for (const r of rows) {
    const entry = out.get(r.id) ?? { id: r.id, name: r.name, instrumentIds: [] };
    if (r.instrumentId) entry.instrumentIds.push(r.instrumentId);
    out.set(r.id, entry);
  }
  return [...out.values()];
}

export async function getInstrumentCertificate(labId: string, instrumentId: string, certificateId: string) {
  const rows = await getDb().select({ certificate: instrumentCertificates }).from(instrumentCertificates)
    .innerJoin(instruments, eq(instruments.id, instrumentCertificates.instrumentId))
    .where(and(eq(instrumentCertificates.id, certificateId), eq(instrumentCertificates.instrumentId, instrumentId), eq(instruments.labId, labId))).limit(1);
  return rows[0]?.certificate;
}
