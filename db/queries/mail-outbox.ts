import { and, desc, eq, inArray, lt, sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { labClients, mailOutbox, organisations, users, type MailOutboxRow } from "@/db/schema";

export type QueuedMail = {
  labId: string | null; toUserId: string | null; toAddress: string; kind: string; subject: string;
  textBody: string; htmlBody: string; fromName: string; dedupeKey?: string | null;
};

/** Queues a mail; with a dedupe key already used, nothing is added and null comes back. */
export async function insertQueuedMail(mail: QueuedMail): Promise<string | null> {
  const rows = await getDb()
    .insert(mailOutbox)
    .values({ ...mail, dedupeKey: mail.dedupeKey ?? null })
    .onConflictDoNothing()
    .returning({ id: mailOutbox.id });
  return rows[0]?.id ?? null;
}

export async function getOutboxMail(id: string): Promise<MailOutboxRow | undefined> {
  const rows = await getDb().select().from(mailOutbox).where(eq(mailOutbox.id, id)).limit(1);
  return rows[0];
}

export async function markMailSent(id: string, attempts: number): Promise<void> {
  await getDb().update(mailOutbox).set({ status: "sent", attempts, sentAt: new Date(), lastError: null }).where(eq(mailOutbox.id, id));
}

/** Records a failed attempt; `final` marks the row failed (no more automatic attempts). */
export async function markMailAttemptFailed(id: string, attempts: number, sentence: string, final: boolean): Promise<void> {
  await getDb().update(mailOutbox)
    .set({ attempts, lastError: sentence, ...(final ? { status: "failed" as const } : {}) })
    .where(and(eq(mailOutbox.id, id), inArray(mailOutbox.status, ["queued", "failed"])));
}

/** Queued rows older than the cut-off: their job may have been lost (Redis away); the sweep enqueues them again. */
export async function listStrandedMailIds(olderThan: Date, limit = 200): Promise<string[]> {
  const rows = await getDb().select({ id: mailOutbox.id }).from(mailOutbox)
    .where(and(eq(mailOutbox.status, "queued"), lt(mailOutbox.createdAt, olderThan)))
    .orderBy(mailOutbox.createdAt).limit(limit);
  return rows.map((r) => r.id);
}

/** Mails still waiting or failed for a lab manager: the lab's own and those to its clients' users. */
export async function listUndeliveredMail(labId: string, limit = 100) {
  return getDb()
    .select({
      id: mailOutbox.id, toAddress: mailOutbox.toAddress, subject: mailOutbox.subject, kind: mailOutbox.kind, status: mailOutbox.status,
      attempts: mailOutbox.attempts, lastError: mailOutbox.lastError, createdAt: mailOutbox.createdAt,
    })
    .from(mailOutbox)
    .where(and(
      inArray(mailOutbox.status, ["queued", "failed"]),
      sql`(${mailOutbox.labId} = ${labId} or exists (
        select 1 from ${users} join ${organisations} on ${organisations.id} = ${users.organisationId}
        join ${labClients} on ${labClients.clientId} = ${organisations.id}
        where ${users.id} = ${mailOutbox.toUserId} and ${labClients.labId} = ${labId}))`,
    ))
    .orderBy(desc(mailOutbox.createdAt))
    .limit(limit);
}

/** Puts a failed mail of the lab's list back to queued (the lab manager asked to try again). */
export async function requeueFailedMail(id: string): Promise<boolean> {
  const rows = await getDb().update(mailOutbox).set({ status: "queued", attempts: 0 })
    .where(and(eq(mailOutbox.id, id), eq(mailOutbox.status, "failed"))).returning({ id: mailOutbox.id });
  return rows.length > 0;
}
