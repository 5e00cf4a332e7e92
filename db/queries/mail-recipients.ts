import { and, asc, eq, gte, inArray, isNull, lt, sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { analyses, captures, labClients, notificationPrefs, organisations, ratings, reports, units, users } from "@/db/schema";

// Who receives which mail, and the facts a mail names. Only enabled accounts receive mail.

const withPrefs = {
  id: users.id, email: users.email, name: users.name, role: users.role,
  prefs: sql<Record<string, unknown> | null>`${notificationPrefs.prefs}`,
};

export async function listLabQualityEngineers(labId: string) {
  return getDb().select(withPrefs).from(users)
    .leftJoin(notificationPrefs, eq(notificationPrefs.userId, users.id))
    .where(and(eq(users.organisationId, labId), eq(users.role, "qa"), isNull(users.disabledAt)))
    .orderBy(asc(users.name));
}

export async function listClientUsers(clientId: string) {
  return getDb().select(withPrefs).from(users)
    .leftJoin(notificationPrefs, eq(notificationPrefs.userId, users.id))
    .where(and(eq(users.organisationId, clientId), eq(users.role, "manufacturer"), isNull(users.disabledAt)))
    .orderBy(asc(users.name));
}

export async function organisationName(id: string): Promise<string | undefined> {
  const rows = await getDb().select({ name: organisations.name }).from(organisations).where(eq(organisations.id, id)).limit(1);
  return rows[0]?.name;
}

/** The name a mail to this organisation's user is sent under: the lab itself, or the first lab a client is linked to. */
export async function senderLabNameFor(organisationId: string): Promise<string | undefined> {
  const rows = await getDb().select({ name: organisations.name, kind: organisations.kind }).from(organisations)
    .where(sql`${organisations.id} = ${organisationId} and ${organisations.kind} = 'lab'
      or ${organisations.id} in (select ${labClients.labId} from ${labClients} where ${labClients.clientId} = ${organisationId})`)
    .orderBy(sql`${organisations.kind} = 'lab' and ${organisations.id} = ${organisationId} desc`, asc(organisations.name))
    .limit(1);
  return rows[0]?.name;
}

/** The current result of a capture with its unit, for an alert; undefined when gone. */
export async function captureAlertFacts(labId: string, captureId: string) {
  const rows = await getDb()
    .select({
      captureId: captures.id, fileName: captures.originalName, unitId: units.id, serial: units.serial, modelCode: ratings.modelCode,
      overall: analyses.overall, labName: organisations.name,
    })
    .from(captures)
    .innerJoin(units, eq(units.id, captures.unitId))
    .innerJoin(ratings, eq(ratings.id, units.ratingId))
    .innerJoin(organisations, eq(organisations.id, captures.labId))
    .innerJoin(analyses, and(eq(analyses.captureId, captures.id), eq(analyses.current, true)))
    .where(and(eq(captures.id, captureId), eq(captures.labId, labId)))
    .limit(1);
  return rows[0];
}

/** Current results outside tolerance or inconclusive, analysed in [from, to), of one lab. */
export async function listAlertingCaptures(labId: string, from: Date, to: Date) {
  return getDb()
    .select({ serial: units.serial, fileName: captures.originalName, overall: analyses.overall })
    .from(captures)
    .innerJoin(units, eq(units.id, captures.unitId))
    .innerJoin(analyses, and(eq(analyses.captureId, captures.id), eq(analyses.current, true)))
    .where(and(eq(captures.labId, labId), inArray(analyses.overall, ["fail", "inconclusive"]), gte(analyses.createdAt, from), lt(analyses.createdAt, to)))
    .orderBy(asc(units.serial), asc(captures.originalName))
    .limit(500);
}

/** Labs with at least one quality engineer asking for a daily digest. */
export async function listLabsWithDigestReaders(): Promise<string[]> {
  const rows = await getDb().selectDistinct({ labId: users.organisationId }).from(users)
    .innerJoin(notificationPrefs, eq(notificationPrefs.userId, users.id))
    .where(and(eq(users.role, "qa"), isNull(users.disabledAt), sql`${notificationPrefs.prefs}->>'captureAlerts' = 'daily-digest'`));
  return rows.map((r) => r.labId);
}

/** A report with what a mail about it names; undefined when there is no such row. */
export async function reportMailFacts(reportId: string) {
  const rows = await getDb()
    .select({
      id: reports.id, labId: reports.labId, clientId: reports.clientId, number: reports.number, revision: reports.revision,
      status: reports.status, reason: reports.reason, withdrawReason: reports.withdrawReason,
      serial: units.serial, modelCode: ratings.modelCode, labName: organisations.name,
    })
    .from(reports)
    .innerJoin(units, eq(units.id, reports.unitId))
    .innerJoin(ratings, eq(ratings.id, units.ratingId))
    .innerJoin(organisations, eq(organisations.id, reports.labId))
    .where(eq(reports.id, reportId))
    .limit(1);
  return rows[0];
}
