import { getDb } from "@/db/client";
import { mailOutbox } from "@/db/schema";

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
