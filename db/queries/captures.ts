import { and, desc, eq, inArray, lt, sql, type SQL } from "drizzle-orm";
import { getDb } from "@/db/client";
import { analyses, captures, ratings, stations, units, users, type Capture, type CaptureState } from "@/db/schema";
import { unitScopeWhere, type Scope } from "./scope";

/** Captures whose unit the scope may see. */
export function captureScopeWhere(scope: Scope): SQL {
  return sql`exists (select 1 from ${units} where ${units.id} = ${captures.unitId} and ${unitScopeWhere(scope)})`;
}

export type NewCapture = typeof captures.$inferInsert;

/** Inserts the capture, or returns the one already stored for the same unit and sha256. */
export async function insertCaptureOnce(values: NewCapture): Promise<{ capture: Capture; duplicate: boolean }> {
  const db = getDb();
  const inserted = await db.insert(captures).values(values).onConflictDoNothing({ target: [captures.unitId, captures.sha256] }).returning();
  if (inserted[0]) return { capture: inserted[0], duplicate: false };
  const existing = await db.select().from(captures).where(and(eq(captures.unitId, values.unitId), eq(captures.sha256, values.sha256))).limit(1);
  if (!existing[0]) throw new Error("capture insert conflicted but no row was found");
  return { capture: existing[0], duplicate: true };
}

export async function setCaptureUpload(scope: Scope, captureId: string, upload: { objectKey: string; multipartUploadId: string | null }) {
  await getDb()
    .update(captures)
    .set({ ...upload, updatedAt: new Date() })
    .where(and(eq(captures.id, captureId), eq(captures.state, "uploading"), captureScopeWhere(scope)));
}

/** The capture with its unit, rating, station and uploader names, as pages and the API show it. */
export async function getCaptureDetail(scope: Scope, captureId: string) {
  const rows = await getDb()
    .select({
      capture: captures, serial: units.serial, unitOrganisationId: units.organisationId, ratingId: ratings.id, ratingTitle: ratings.title,
      modelCode: ratings.modelCode, stationName: stations.name, uploadedBy: users.name,
    })
    .from(captures)
    .innerJoin(units, eq(units.id, captures.unitId))
    .innerJoin(ratings, eq(ratings.id, units.ratingId))
    .leftJoin(stations, eq(stations.id, captures.stationId))
    .leftJoin(users, eq(users.id, captures.uploadedById))
    .where(and(eq(captures.id, captureId), unitScopeWhere(scope)))
    .limit(1);
  return rows[0];
}

/** Moves an uploaded capture to queued; null when it was not in state uploading (already completed). */
export async function markCaptureQueued(scope: Scope, captureId: string, objectEtag: string): Promise<Capture | null> {
  const rows = await getDb()
    .update(captures)
    .set({ state: "queued", objectEtag, multipartUploadId: null, progress: 0, stateMessage: null, uploadedAt: new Date(), updatedAt: new Date() })
    .where(and(eq(captures.id, captureId), eq(captures.state, "uploading"), captureScopeWhere(scope)))
    .returning();
  return rows[0] ?? null;
}

/** Final states are only written from the states that lead to them, so a late writer cannot undo one. */
export async function setCaptureState(
  scope: Scope,
  captureId: string,
  to: CaptureState,
  from: readonly CaptureState[],
  extra: { stateMessage?: string | null; progress?: number } = {},
): Promise<boolean> {
  const rows = await getDb()
    .update(captures)
    .set({ state: to, ...extra, updatedAt: new Date() })
    .where(and(eq(captures.id, captureId), inArray(captures.state, [...from]), captureScopeWhere(scope)))
    .returning({ id: captures.id });
  return rows.length > 0;
}

/** The worker's claim: queued (or a taken-over analysing) capture becomes analysing, one more attempt. */
export async function claimCaptureForAnalysis(scope: Scope, captureId: string) {
  const rows = await getDb()
    .update(captures)
    .set({ state: "analysing", progress: 1, stateMessage: null, attempts: sql`${captures.attempts} + 1`, updatedAt: new Date() })
    .where(and(eq(captures.id, captureId), inArray(captures.state, ["queued", "analysing"]), captureScopeWhere(scope)))
    .returning();
  const capture = rows[0];
  if (!capture) return null;
  const unitRows = await getDb()
    .select({ unit: units, rating: ratings })
    .from(units)
    .innerJoin(ratings, eq(ratings.id, units.ratingId))
    .where(and(eq(units.id, capture.unitId), unitScopeWhere(scope)))
    .limit(1);
  const found = unitRows[0];
  return found ? { capture, unit: found.unit, rating: found.rating } : null;
}

export async function setCaptureProgress(scope: Scope, captureId: string, progress: number): Promise<void> {
  await getDb()
    .update(captures)
    .set({ progress: Math.max(0, Math.min(99, Math.round(progress))), updatedAt: new Date() })
    .where(and(eq(captures.id, captureId), eq(captures.state, "analysing"), captureScopeWhere(scope)));
}

export async function listCapturesForUnit(scope: Scope, unitId: string) {
  return getDb()
    .select({
      id: captures.id, testKind: captures.testKind, state: captures.state, stateMessage: captures.stateMessage,
      originalName: captures.originalName, speedRpm: captures.speedRpm, createdAt: captures.createdAt,
      overall: analyses.overall, frequencyHz: analyses.frequencyHz, worstThdPercent: analyses.worstThdPercent,
      vufPercent: analyses.vufPercent, keLineRmsPerKrpm: analyses.keLineRmsPerKrpm, judgedStepId: analyses.planStepId,
    })
    .from(captures)
    .innerJoin(units, eq(units.id, captures.unitId))
    .leftJoin(analyses, and(eq(analyses.captureId, captures.id), eq(analyses.current, true)))
    .where(and(eq(captures.unitId, unitId), unitScopeWhere(scope)))
    .orderBy(desc(captures.createdAt))
    .limit(200);
}

/**
 * The worker's recovery sweep, across every lab: ids and lab ids only of captures waiting for
 * analysis whose row has not moved for `idleMs`. The caller checks each against the queue.
 */
export async function listIdleCapturesAwaitingAnalysis(idleMs: number, limit = 500, afterId?: string) {
  const where = [inArray(captures.state, ["queued", "analysing"]), lt(captures.updatedAt, new Date(Date.now() - idleMs))];
  if (afterId) where.push(sql`${captures.id} > ${afterId}`);
  return getDb()
    .select({ captureId: captures.id, labId: captures.labId, state: captures.state })
    .from(captures)
    .where(and(...where))
    .orderBy(captures.id)
    .limit(limit);
}

/**
 * Puts finished captures back in the queue for a new run (a newer engine, an edited tolerance
 * profile). Their current analysis stays until the new one replaces it; both are kept.
 */
export async function requeueFinishedCaptures(scope: Scope, target: { captureId: string } | { ratingId: string }) {
  const which = "captureId" in target
    ? eq(captures.id, target.captureId)
    : sql`${captures.unitId} in (select ${units.id} from ${units} where ${units.ratingId} = ${target.ratingId})`;
  return getDb()
    .update(captures)
    .set({ state: "queued", progress: 0, stateMessage: "Re-analysis requested", updatedAt: new Date() })
    .where(and(which, inArray(captures.state, ["analysed", "rejected", "failed"]), captureScopeWhere(scope)))
    .returning({ captureId: captures.id, labId: captures.labId });
}

/** State and server timestamps of given captures (the pipeline benchmark's measurements). */
export async function listBenchCaptureTimes(scope: Scope, captureIds: string[]) {
  if (captureIds.length === 0) return [];
  return getDb()
    .select({ id: captures.id, state: captures.state, uploadedAt: captures.uploadedAt, analysedAt: captures.analysedAt })
    .from(captures)
    .where(and(inArray(captures.id, captureIds), captureScopeWhere(scope)));
}

/** Marks an upload as still going (more part URLs asked for), so the abandoned-upload sweep leaves it be. */
export async function touchUploadingCapture(scope: Scope, captureId: string): Promise<boolean> {
  const touched = await getDb()
    .update(captures)
    .set({ updatedAt: new Date() })
    .where(and(eq(captures.id, captureId), eq(captures.state, "uploading"), captureScopeWhere(scope)))
    .returning({ id: captures.id });
  return touched.length > 0;
}

/**
 * The worker's abandoned-upload sweep, across every lab: removes rows still `uploading` whose last
 * upload URL was issued before `before`, in one statement each page, and returns what they
 * pointed at in storage so the caller can clean it. Nothing references such a row (no analysis).
 */
export async function deleteAbandonedUploads(before: Date, limit = 200) {
  const stale = getDb()
    .select({ id: captures.id })
    .from(captures)
    .where(and(eq(captures.state, "uploading"), lt(captures.updatedAt, before)))
    .orderBy(captures.id)
    .limit(limit);
  return getDb()
    .delete(captures)
    .where(and(inArray(captures.id, stale), eq(captures.state, "uploading"), lt(captures.updatedAt, before)))
    .returning({ captureId: captures.id, objectKey: captures.objectKey, multipartUploadId: captures.multipartUploadId });
}
