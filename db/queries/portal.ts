import { and, desc, eq, gte, ilike, inArray, lt, sql, type SQL } from "drizzle-orm";
import { getDb } from "@/db/client";
import { labClients, organisations, ratings, reports, units } from "@/db/schema";
import type { PgSelect } from "drizzle-orm/pg-core";

// Released reports as a client reads them: its own (reports.client_id), from labs it is linked to.

export type PortalFilter = { serial?: string; model?: string; from?: Date; to?: Date; limit?: number; offset?: number };

/** What a list shows: not the report's content nor where its file is kept. */
const listColumns = {
  id: reports.id, number: reports.number, revision: reports.revision, status: reports.status,
  sha256: reports.sha256, sizeBytes: reports.sizeBytes, disposition: reports.disposition, overall: reports.overall,
  releasedAt: reports.releasedAt, withdrawnAt: reports.withdrawnAt, withdrawReason: reports.withdrawReason, serial: units.serial,
  modelCode: ratings.modelCode, labName: organisations.name,
};
const columns = { ...listColumns, objectKey: reports.objectKey, content: reports.content };

function clientWhere(clientId: string): SQL {
  return and(
    eq(reports.clientId, clientId), eq(units.organisationId, clientId),
    sql`exists (select 1 from ${labClients} where ${labClients.labId} = ${reports.labId} and ${labClients.clientId} = ${clientId})`,
  ) as SQL;
}

const escapeLike = (s: string) => s.replace(/[\\%_]/g, (c) => `\\${c}`);

/** A released report with its unit, rating and lab: the joins every portal read shares. */
function withUnitRatingLab<T extends PgSelect>(query: T) {
  return query
    .innerJoin(units, eq(units.id, reports.unitId))
    .innerJoin(ratings, eq(ratings.id, units.ratingId))
    .innerJoin(organisations, eq(organisations.id, reports.labId));
}

const base = () => withUnitRatingLab(getDb().select(columns).from(reports).$dynamic());
/** Without the bulky columns (content, object key): the list. */
const listBase = () => withUnitRatingLab(getDb().select(listColumns).from(reports).$dynamic());

export type PortalReportRow = Awaited<ReturnType<typeof getClientReports>>[number];
export type PortalListRow = Awaited<ReturnType<typeof listClientReports>>[number];

export async function listClientReports(clientId: string, f: PortalFilter = {}) {
  const where = [clientWhere(clientId)];
  if (f.serial) where.push(ilike(units.serial, `%${escapeLike(f.serial)}%`));
  if (f.model) where.push(ilike(ratings.modelCode, `%${escapeLike(f.model)}%`));
  if (f.from) where.push(gte(reports.releasedAt, f.from));
  if (f.to) where.push(lt(reports.releasedAt, f.to));
  return listBase().where(and(...where)).orderBy(desc(reports.releasedAt), desc(reports.revision), desc(reports.id)).limit(f.limit ?? 200).offset(f.offset ?? 0);
}

/** Exactly this serial (the API), every revision, newest first. */
export async function listClientReportsBySerial(clientId: string, serial: string) {
  return base().where(and(clientWhere(clientId), eq(units.serial, serial))).orderBy(desc(reports.releasedAt), desc(reports.revision)).limit(200);
}

export async function getClientReports(clientId: string, ids: readonly string[]) {
  if (ids.length === 0) return [];
  return base().where(and(clientWhere(clientId), inArray(reports.id, [...ids])));
}

/** Every revision of one report number, newest revision first. */
export async function getClientReportByNumber(clientId: string, number: string) {
  return base().where(and(clientWhere(clientId), eq(reports.number, number))).orderBy(desc(reports.revision));
}

/** For the lab's per-unit CSV: the unit's valid released report, if any (lab scope). */
export async function getValidReportForLabUnit(labId: string, unitId: string) {
  const rows = await base().where(and(eq(reports.labId, labId), eq(reports.unitId, unitId), eq(reports.status, "valid")))
    .orderBy(desc(reports.revision)).limit(1);
  return rows[0];
}
