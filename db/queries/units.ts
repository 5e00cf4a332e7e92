import { and, asc, desc, eq, ilike, isNull, sql, type SQL } from "drizzle-orm";
import { getDb } from "@/db/client";
import { captures, organisations, ratings, units, type Unit } from "@/db/schema";
import { linkedClientWhere, unitScopeWhere, type Scope } from "./scope";

export type UnitListFilter = { search?: string; overall?: Unit["latestOverall"] | "untested"; includeRetired?: boolean; limit?: number; offset?: number };

/**
 * One page of the scope's units, most recently tested (or registered) first. The page's ids are chosen
 * first (ties broken by id, so pages never overlap) and only those rows get their capture count:
 * counted in the same select, the count ran for every row the offset skips (2 501 counts for page 50,
 * 320 ms at a million captures).
 */
export async function listUnits(scope: Scope, filter: UnitListFilter = {}) {
  const where: SQL[] = [unitScopeWhere(scope)];
  if (!filter.includeRetired) where.push(sql`${units.retiredAt} is null`);
  if (filter.search) where.push(ilike(units.serial, `%${filter.search.replace(/[%_\\]/g, "\\$&")}%`));
  if (filter.overall === "untested") where.push(sql`${units.latestOverall} is null`);
  else if (filter.overall) where.push(eq(units.latestOverall, filter.overall));
  const db = getDb();
  const newest = sql`coalesce(${units.latestCaptureAt}, ${units.createdAt})`;
  const page = db
    .select({ id: units.id, newest: sql<Date>`${newest}`.as("newest"), serial: units.serial })
    .from(units)
    .where(and(...where))
    .orderBy(desc(newest), asc(units.serial), asc(units.id))
    .limit(filter.limit ?? 100)
    .offset(filter.offset ?? 0)
    .as("page");
  return db
    .select({
      id: units.id, serial: units.serial, disposition: units.disposition, latestOverall: units.latestOverall,
      latestCaptureAt: units.latestCaptureAt, ratingTitle: ratings.title, modelCode: ratings.modelCode, planState: units.planState,
      owner: organisations.name,
      captureCount: sql<number>`(select count(*) from ${captures} where ${captures.unitId} = ${units.id})`.mapWith(Number),
    })
    .from(page)
    .innerJoin(units, eq(units.id, page.id))
    .innerJoin(ratings, eq(ratings.id, units.ratingId))
    .innerJoin(organisations, eq(organisations.id, units.organisationId))
    .orderBy(desc(page.newest), asc(page.serial), asc(page.id));
}

async function findUnit(scope: Scope, match: SQL) {
  const rows = await getDb()
    .select({ unit: units, rating: ratings, owner: organisations.name })
    .from(units)
    .innerJoin(ratings, eq(ratings.id, units.ratingId))
    .innerJoin(organisations, eq(organisations.id, units.organisationId))
    .where(and(unitScopeWhere(scope), match))
    .limit(1);
  return rows[0];
}

export function getUnit(scope: Scope, unitId: string) {
  return findUnit(scope, eq(units.id, unitId));
}

export function getUnitBySerial(scope: Scope, serial: string) {
  return findUnit(scope, eq(units.serial, serial));
}

export async function countUnitsByOverall(scope: Scope) {
  const rows = await getDb()
    .select({ overall: units.latestOverall, n: sql<number>`count(*)`.mapWith(Number) })
    .from(units)
    .where(unitScopeWhere(scope))
    .groupBy(units.latestOverall);
  const counts = { pass: 0, marginal: 0, inconclusive: 0, fail: 0, "not-required": 0, "not-applicable": 0, untested: 0, total: 0 };
  for (const r of rows) {
    counts[r.overall ?? "untested"] += r.n;
    counts.total += r.n;
  }
  return counts;
}

/** A lab registers units only against its own ratings of clients it is linked to. */
function registrableRatingWhere(labId: string) {
  return and(
    eq(ratings.labId, labId), isNull(ratings.retiredAt), linkedClientWhere(labId, ratings.organisationId),
    sql`not exists (select 1 from ${organisations} o where o.id = ${ratings.organisationId} and o.deactivated_at is not null)`,
  );
}

/** Ratings a lab may register new units against (its own, for its own clients), with the owner's name. */
export async function listRatingsForRegistration(scope: Scope) {
  if (scope.kind !== "lab") return [];
  return getDb()
    .select({ id: ratings.id, modelCode: ratings.modelCode, title: ratings.title, owner: organisations.name })
    .from(ratings)
    .innerJoin(organisations, eq(organisations.id, ratings.organisationId))
    .where(registrableRatingWhere(scope.labId))
    .orderBy(asc(organisations.name), asc(ratings.modelCode));
}

export async function getRatingForRegistration(scope: Scope, ratingId: string) {
  if (scope.kind !== "lab") return undefined;
  const rows = await getDb().select().from(ratings).where(and(eq(ratings.id, ratingId), registrableRatingWhere(scope.labId))).limit(1);
  return rows[0];
}

/** Registers a unit in the scope's lab, owned by the rating's manufacturer; returns the existing one on a serial clash. */
export async function insertUnitOnce(scope: Scope & { kind: "lab" }, values: { serial: string; ratingId: string; organisationId: string }): Promise<Unit> {
  const db = getDb();
  const inserted = await db.insert(units).values({ ...values, labId: scope.labId }).onConflictDoNothing({ target: [units.labId, units.serial] }).returning();
  if (inserted[0]) return inserted[0];
  const existing = await db.select().from(units).where(and(eq(units.labId, scope.labId), eq(units.serial, values.serial))).limit(1);
  if (!existing[0]) throw new Error("unit insert conflicted but no row was found");
  return existing[0];
}
