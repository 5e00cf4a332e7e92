import { getOutboxMail, listStrandedMailIds, markMailAttemptFailed, markMailSent } from "@/db/queries/mail-outbox";
import { mailFailureSentence, sendMail } from "./mail";
import { enqueueMailJob, getMailQueue, mailJobId } from "./mail-queue";

// The worker's side of the outbox: send one row, record the attempt; throw so BullMQ retries with backoff.

export class MailAttemptFailed extends Error {
  override name = "MailAttemptFailed";
}

export type DeliveryOutcome = "sent" | "already-sent" | "missing";

/** `attempt` counts from 1; on the last allowed attempt a failure marks the row failed. */
export async function deliverOutboxMail(outboxId: string, attempt: number, allowed: number): Promise<DeliveryOutcome> {
  const row = await getOutboxMail(outboxId);
  if (!row) return "missing";
  if (row.status === "sent") return "already-sent";
  const attempts = row.attempts + 1;
  try {
    await sendMail({ to: row.toAddress, subject: row.subject, text: row.textBody, html: row.htmlBody, fromName: row.fromName });
  } catch (err) {
    const sentence = mailFailureSentence(err);
    await markMailAttemptFailed(outboxId, attempts, attempt >= allowed ? sentence.replace(/; the mail is sent again automatically\.$/, ": no more attempts.") : sentence, attempt >= allowed);
    throw new MailAttemptFailed(sentence);
  }
  await markMailSent(outboxId, attempts);
  return "sent";
}

/** Gives queued rows older than a minute a job again when theirs is gone (Redis restarted or was down). */
export async function sweepStrandedMail(now = new Date()): Promise<{ requeued: number }> {
  const ids = await listStrandedMailIds(new Date(now.getTime() - 60_000));
  let requeued = 0;
  for (const id of ids) {
    const job = await getMailQueue().getJob(mailJobId(id));
    if (job) {
      const state = await job.getState();
      if (state !== "failed" && state !== "completed") continue;
      await job.remove().catch(() => undefined);
    }
    await enqueueMailJob(id);
    requeued += 1;
  }
  return { requeued };
}
