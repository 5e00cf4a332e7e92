import { and, asc, desc, eq, sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { organisations, reports, units, type Report } from "@/db/schema";
import { takeReportNumber } from "./lab-settings";
import { unitScopeWhere, type Scope } from "./scope";

/** What a release stores beside its number: the rendered file's facts, built once the number is known. */
export type ReleasedFields = Pick<
  typeof reports.$inferInsert,
  "objectKey" | "sha256" | "sizeBytes" | "pageCount" | "disposition" | "overall" | "content" | "releasedById" | "signatureId" | "reason"
>;
export type Numbering = { number: string; revision: number; previous: Report | null };
type Build = (numbering: Numbering) => Promise<ReleasedFields>;

type Tx = Parameters<Parameters<ReturnType<typeof getDb>["transaction"]>[0]>[0];

// Releases of one lab wait for each other on the lab_settings row anyway; queuing them here first keeps
// the waiting ones from holding pool connections while an earlier release renders its PDF.
const globalForQueue = globalThis as unknown as { emfolioReleaseQueues?: Map<string, Promise<unknown>> };

function oneAtATimePerLab<T>(labId: string, task: () => Promise<T>): Promise<T> {
  const queues = (globalForQueue.emfolioReleaseQueues ??= new Map());
  const previous = queues.get(labId) ?? Promise.resolve();
  const run = previous.then(task, task);
  const settled = run.catch(() => undefined);
  queues.set(labId, settled);
  void settled.then(() => {
    if (queues.get(labId) === settled) queues.delete(labId);
  });
  return run;
}

async function lockUnit(tx: Tx, labId: string, unitId: string) {
  const rows = await tx.select({ id: units.id, clientId: units.organisationId }).from(units)
    .where(and(eq(units.id, unitId), eq(units.labId, labId))).for("update").limit(1);
  return rows[0];
}

async function latestRevision(tx: Tx, unitId: string): Promise<Report | undefined> {
  const rows = await tx.select().from(reports).where(eq(reports.unitId, unitId)).orderBy(desc(reports.revision)).limit(1);
  return rows[0];
}

/**
 * Revision 1 of a unit's report under a new number, in one transaction: the unit row is locked (one
 * release per unit at a time), the number is taken from lab_settings, `build` renders and stores the PDF,
 * then the row is inserted. "exists" when the unit already has a report (supersede it instead).
 */
export async function insertFirstRevision(labId: string, unitId: string, build: Build): Promise<Report | "missing" | "exists"> {
  return oneAtATimePerLab(labId, () => getDb().transaction(async (tx) => {
    const unit = await lockUnit(tx, labId, unitId);
    if (!unit) return "missing";
    if (await latestRevision(tx, unitId)) return "exists";
    const number = await takeReportNumber(tx, labId);
    const fields = await build({ number, revision: 1, previous: null });
    const [row] = await tx.insert(reports).values({ ...fields, labId, unitId, clientId: unit.clientId, number, revision: 1 }).returning();
    if (!row) throw new Error("The report row was not stored");
    return row;
  }));
}

/** A new revision under the same number; the one before is marked superseded (a withdrawn one stays withdrawn) and points at it. */
export async function insertNextRevision(labId: string, unitId: string, build: Build): Promise<Report | "missing" | "none"> {
  return getDb().transaction(async (tx) => {
    const unit = await lockUnit(tx, labId, unitId);
    if (!unit) return "missing";
    const previous = await latestRevision(tx, unitId);
    if (!previous) return "none";
    const revision = previous.revision + 1;
    const fields = await build({ number: previous.number, revision, previous });
    const [row] = await tx.insert(reports).values({ ...fields, labId, unitId, clientId: unit.clientId, number: previous.number, revision }).returning();
    if (!row) throw new Error("The report row was not stored");
    await tx.update(reports)
      .set({ supersededById: row.id, status: sql`case when ${reports.status} = 'valid' then 'superseded'::report_status else ${reports.status} end` })
      .where(eq(reports.id, previous.id));
    return row;
  });
}

/** Withdraws the unit's current valid revision; "none" when there is no valid one. */
export async function withdrawLatest(labId: string, unitId: string, values: { userId: string; reason: string }): Promise<Report | "missing" | "none"> {
  return getDb().transaction(async (tx) => {
    const unit = await lockUnit(tx, labId, unitId);
    if (!unit) return "missing";
    const latest = await latestRevision(tx, unitId);
    if (!latest || latest.status !== "valid") return "none";
    const [row] = await tx.update(reports)
      .set({ status: "withdrawn", withdrawnAt: new Date(), withdrawnById: values.userId, withdrawReason: values.reason })
      .where(and(eq(reports.id, latest.id), eq(reports.status, "valid"))).returning();
    return row ?? "none";
  });
}

/** Every revision of a unit's report in the caller's scope, newest first. */
export async function listUnitReports(scope: Scope, unitId: string): Promise<Report[]> {
  const rows = await getDb().select({ report: reports }).from(reports).innerJoin(units, eq(units.id, reports.unitId))
    .where(and(eq(reports.unitId, unitId), unitScopeWhere(scope))).orderBy(desc(reports.revision)).limit(100);
  return rows.map((r) => r.report);
}

/** One revision in the caller's scope (another organisation's answers undefined, like a missing one). */
export async function findReport(scope: Scope, reportId: string) {
  const rows = await getDb().select({ report: reports, serial: units.serial }).from(reports).innerJoin(units, eq(units.id, reports.unitId))
    .where(and(eq(reports.id, reportId), unitScopeWhere(scope))).limit(1);
  return rows[0];
}

/** The public facts of every revision of a number (the verification page): nothing beyond what it shows. */
export async function listRevisionsByNumber(number: string) {
  return getDb()
    .select({
      id: reports.id, number: reports.number, revision: reports.revision, status: reports.status, sha256: reports.sha256,
      releasedAt: reports.releasedAt, supersededById: reports.supersededById, serial: units.serial, client: organisations.name,
    })
    .from(reports)
    .innerJoin(units, eq(units.id, reports.unitId))
    .innerJoin(organisations, eq(organisations.id, reports.clientId))
    .where(eq(reports.number, number))
    .orderBy(asc(reports.revision))
    .limit(50);
}
