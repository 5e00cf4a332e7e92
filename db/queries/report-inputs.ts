import { and, desc, eq, inArray } from "drizzle-orm";
import { getDb } from "@/db/client";
import {
  analyses, captureInstruments, captures, instruments, labSettings, organisations, overdueConfirmations, planSteps, ratings, stepRecords,
  unitEvents, unitNotes, units,
} from "@/db/schema";

/** The unit, its rating, the lab and the client with their addresses, and the lab's report footer; undefined outside the lab. */
export async function loadReportUnit(labId: string, unitId: string) {
  const db = getDb();
  const [row] = await db.select({ unit: units, rating: ratings }).from(units).innerJoin(ratings, eq(ratings.id, units.ratingId))
    .where(and(eq(units.id, unitId), eq(units.labId, labId))).limit(1);
  if (!row) return undefined;
  const orgs = await db.select({ id: organisations.id, name: organisations.name, address: organisations.address })
    .from(organisations).where(inArray(organisations.id, [labId, row.unit.organisationId]));
  const [settings] = await db.select({ footer: labSettings.reportFooter }).from(labSettings).where(eq(labSettings.labId, labId)).limit(1);
  const lab = orgs.find((o) => o.id === labId);
  const client = orgs.find((o) => o.id === row.unit.organisationId);
  if (!lab || !client) return undefined;
  return { ...row, lab, client, footer: settings?.footer ?? "" };
}

/** The captures of record with their current analysis (report, preview, spectrum), for a unit of the lab. */
export async function loadRecordCaptures(labId: string, unitId: string, captureIds: string[]) {
  if (captureIds.length === 0) return [];
  return getDb()
    .select({
      id: captures.id, originalName: captures.originalName, sha256: captures.sha256, createdAt: captures.createdAt, speedRpm: captures.speedRpm,
      magnetTemperatureC: captures.magnetTemperatureC, testKind: captures.testKind,
      analysisVersion: analyses.analysisVersion, overall: analyses.overall, report: analyses.report, preview: analyses.preview, spectrum: analyses.spectrum,
    })
    .from(captures)
    .innerJoin(analyses, and(eq(analyses.captureId, captures.id), eq(analyses.current, true)))
    .where(and(eq(captures.labId, labId), eq(captures.unitId, unitId), inArray(captures.id, captureIds)));
}

/** Instruments recorded for these captures, with their calibration due dates. */
export async function loadCaptureInstruments(captureIds: string[]) {
  if (captureIds.length === 0) return [];
  return getDb()
    .select({
      captureId: captureInstruments.captureId, channel: captureInstruments.channel, kind: instruments.kind, make: instruments.make,
      model: instruments.model, serial: instruments.serial, assetTag: instruments.assetTag, calibrationDue: instruments.calibrationDue,
    })
    .from(captureInstruments)
    .innerJoin(instruments, eq(instruments.id, captureInstruments.instrumentId))
    .where(inArray(captureInstruments.captureId, captureIds));
}

/** What the report states in plain words beside the results: chosen records, overdue confirmations, the concession, client notes. */
export async function loadReportRemarks(unitId: string, captureIds: string[]) {
  const db = getDb();
  const [choices, overdue, concession, notes] = await Promise.all([
    db.select({ stepName: planSteps.name, reason: stepRecords.reason }).from(stepRecords).innerJoin(planSteps, eq(planSteps.id, stepRecords.planStepId))
      .where(eq(stepRecords.unitId, unitId)),
    captureIds.length === 0 ? Promise.resolve([]) : db.select({ captureId: overdueConfirmations.captureId, reason: overdueConfirmations.reason })
      .from(overdueConfirmations).where(inArray(overdueConfirmations.captureId, captureIds)),
    db.select({ comment: unitEvents.comment, reference: unitEvents.concessionRef }).from(unitEvents)
      .where(and(eq(unitEvents.unitId, unitId), eq(unitEvents.toDisposition, "accepted-with-concession"))).orderBy(desc(unitEvents.createdAt)).limit(1),
    db.select({ body: unitNotes.body }).from(unitNotes).where(and(eq(unitNotes.unitId, unitId), eq(unitNotes.visibility, "client"))).orderBy(unitNotes.createdAt).limit(50),
  ]);
  return { choices, overdue, concession: concession[0] ?? null, clientNotes: notes.map((n) => n.body) };
}
