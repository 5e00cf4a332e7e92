import { and, eq, ne, sql } from "drizzle-orm";
import { getDb, type Db } from "@/db/client";
import { labSettings, organisations, reports, type LabSettings } from "@/db/schema";

type Tx = Parameters<Parameters<Db["transaction"]>[0]>[0];

/** The prefix a lab starts with: its slug in capitals, so two labs never begin on the same numbers. */
export function defaultReportPrefix(slug: string): string {
  const stem = slug.toUpperCase().replace(/[^A-Z0-9]+/g, "").slice(0, 8) || "LAB";
  return `${stem}-`;
}

async function ensureRow(db: Db | Tx, labId: string): Promise<void> {
  const [org] = await db.select({ slug: organisations.slug }).from(organisations).where(eq(organisations.id, labId)).limit(1);
  if (!org) throw new Error("No such lab");
  await db.insert(labSettings).values({ labId, reportPrefix: defaultReportPrefix(org.slug) }).onConflictDoNothing({ target: labSettings.labId });
}

/** The lab's numbering, creating the row with the defaults on first use. */
export async function getLabSettings(labId: string): Promise<LabSettings> {
  const db = getDb();
  await ensureRow(db, labId);
  const [row] = await db.select().from(labSettings).where(eq(labSettings.labId, labId)).limit(1);
  if (!row) throw new Error("The lab's settings row could not be created");
  return row;
}

export function formatReportNumber(prefix: string, sequence: number): string {
  return `${prefix}${String(sequence).padStart(6, "0")}`;
}

/**
 * Takes the lab's next report number inside the caller's transaction: one UPDATE … RETURNING, so the row
 * stays locked until the release commits and two releases never share a number (a rollback gives it back).
 */
export async function takeReportNumber(tx: Tx, labId: string): Promise<string> {
  await ensureRow(tx, labId);
  const [row] = await tx
    .update(labSettings)
    .set({ nextReportNumber: sql`${labSettings.nextReportNumber} + 1`, updatedAt: new Date() })
    .where(eq(labSettings.labId, labId))
    .returning({ prefix: labSettings.reportPrefix, taken: sql<number>`${labSettings.nextReportNumber} - 1`.mapWith(Number) });
  if (!row) throw new Error("The lab's numbering row is missing");
  return formatReportNumber(row.prefix, row.taken);
}

/** Another lab already numbers its reports with this prefix (numbers must be unique across labs). */
export async function prefixTakenByOtherLab(labId: string, prefix: string): Promise<boolean> {
  const rows = await getDb().select({ id: labSettings.labId }).from(labSettings)
    .where(and(ne(labSettings.labId, labId), sql`lower(${labSettings.reportPrefix}) = lower(${prefix})`)).limit(1);
  return rows.length > 0;
}

export async function updateLabSettings(labId: string, values: { reportPrefix: string; nextReportNumber: number; reportFooter: string }): Promise<void> {
  await getLabSettings(labId);
  await getDb().update(labSettings).set({ ...values, updatedAt: new Date() }).where(eq(labSettings.labId, labId));
}

/** A number already printed on a released report of any lab (any revision). */
export async function reportNumberUsed(number: string): Promise<boolean> {
  const rows = await getDb().select({ id: reports.id }).from(reports).where(eq(reports.number, number)).limit(1);
  return rows.length > 0;
}
