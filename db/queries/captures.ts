import { and, desc, eq, inArray, lt, sql, type SQL } from "drizzle-orm";
import { getDb } from "@/db/client";
import { analyses, captureInstruments, captures, ratings, stations, units, users, type Capture, type CaptureState } from "@/db/schema";
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

/** Removes a capture that never got a stored object (a registration or completion that was refused); analysed rows are never touched. */
export async function deleteUploadingCapture(scope: Scope, captureId: string): Promise<boolean> {
  return getDb().transaction(async (tx) => {
    const where = and(eq(captures.id, captureId), eq(captures.state, "uploading"), captureScopeWhere(scope));
    // The instruments named at registration go with the row.
    await tx.delete(captureInstruments).where(inArray(captureInstruments.captureId, tx.select({ id: captures.id }).from(captures).where(where)));
    const rows = await tx.delete(captures).where(where).returning({ id: captures.id });
    return rows.length > 0;
  });
}

/**
 * One upload in progress per capture: takes over an upload idle (no URL issued or used) for
 * `leaseMs`, in one statement so of concurrent registrations exactly one wins. Otherwise says how
 * long the lease still runs.
 */
export async function takeOverIdleUpload(
  scope: Scope, captureId: string, leaseMs: number, sizeBytes: number,
): Promise<{ kind: "taken"; capture: Capture } | { kind: "busy"; retryAfterS: number } | { kind: "gone" }> {
  const cutoff = new Date(Date.now() - leaseMs);
  const rows = await getDb()
    .update(captures)
    .set({ sizeBytes, multipartUploadId: null, updatedAt: new Date() })
    .where(and(eq(captures.id, captureId), eq(captures.state, "uploading"), lt(captures.updatedAt, cutoff), captureScopeWhere(scope)))
    .returning();
  if (rows[0]) return { kind: "taken", capture: rows[0] };
  const current = await getDb()
    .select({ state: captures.state, updatedAt: captures.updatedAt })
    .from(captures)
    .where(and(eq(captures.id, captureId), captureScopeWhere(scope)))
    .limit(1);
  const row = current[0];
  if (!row || row.state !== "uploading") return { kind: "gone" };
  return { kind: "busy", retryAfterS: Math.max(1, Math.ceil((row.updatedAt.getTime() + leaseMs - Date.now()) / 1000)) };
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

/** Says why an analysis is waiting (a service it needs did not answer) and shows the row is still looked after. */
export async function noteCaptureWaiting(scope: Scope, captureId: string, stateMessage: string): Promise<void> {
  await getDb()
    .update(captures)
    .set({ stateMessage, updatedAt: new Date() })
    .where(and(eq(captures.id, captureId), inArray(captures.state, ["queued", "analysing"]), captureScopeWhere(scope)));
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
 * analysis whose row has not moved for `idleMs` (queued) or `analysingIdleMs` (analysing). The
 * caller checks each against the queue.
 */
export async function listIdleCapturesAwaitingAnalysis(idleMs: number, limit = 500, afterId?: string, analysingIdleMs = idleMs) {
  const now = Date.now();
  const where = [
    sql`((${captures.state} = 'queued' and ${captures.updatedAt} < ${new Date(now - idleMs).toISOString()})
      or (${captures.state} = 'analysing' and ${captures.updatedAt} < ${new Date(now - analysingIdleMs).toISOString()}))`,
  ];
  if (afterId) where.push(sql`${captures.id} > ${afterId}`);
  return getDb()
    .select({ captureId: captures.id, labId: captures.labId, state: captures.state })
    .from(captures)
    .where(and(...where))
    .orderBy(captures.id)
    .limit(limit);
}

/** Captures waiting for or in analysis across every lab, counted up to `cap` (so the count stays cheap when it is huge). */
export async function countAnalysisBacklog(cap: number): Promise<number> {
  const rows = await getDb().execute<{ n: number }>(sql`select count(*)::int as n from (
    select 1 from ${captures} where ${captures.state} in ('queued', 'analysing') limit ${cap}) as waiting`);
  return Number(rows.rows[0]?.n ?? 0);
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
  return getDb().transaction(async (tx) => {
    // Locked, so an upload touched meanwhile waits and is then judged on its new time.
    const stale = await tx
      .select({ id: captures.id })
      .from(captures)
      .where(and(eq(captures.state, "uploading"), lt(captures.updatedAt, before)))
      .orderBy(captures.id)
      .limit(limit)
      .for("update");
    if (stale.length === 0) return [];
    const ids = stale.map((r) => r.id);
    // The instruments named at registration go with the rows.
    await tx.delete(captureInstruments).where(inArray(captureInstruments.captureId, ids));
    return tx
      .delete(captures)
      .where(and(inArray(captures.id, ids), eq(captures.state, "uploading"), lt(captures.updatedAt, before)))
      .returning({ captureId: captures.id, objectKey: captures.objectKey, multipartUploadId: captures.multipartUploadId });
  });
}
