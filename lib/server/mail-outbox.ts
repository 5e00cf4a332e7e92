import { insertQueuedMail, type QueuedMail } from "@/db/queries/mail-outbox";
import { enqueueMailJob } from "./mail-queue";

// Every mail starts here: a row in mail_outbox, then a job for the worker. Neither step may block or
// fail the action that asked for the mail: a row that got no job is enqueued by the worker's sweep,
// and a row that could not be written is logged (the action's own result stands).

export type QueueOutcome = "queued" | "duplicate" | "not-queued";

/**
 * `enqueue: false` only writes the row and leaves the job to the caller (the analysis child process
 * never talks to Redis; its parent enqueues the ids it returns).
 */
export async function queueMail(mail: QueuedMail, options: { enqueue?: boolean; ids?: string[] } = {}): Promise<QueueOutcome> {
  let id: string | null;
  try {
    id = await insertQueuedMail(mail);
  } catch (err) {
    console.error(`mail ${mail.kind} to user ${mail.toUserId ?? "?"} not queued: ${err instanceof Error ? err.message.split("\n")[0] : String(err)}`);
    return "not-queued";
  }
  if (!id) return "duplicate";
  options.ids?.push(id);
  if (options.enqueue === false) return "queued";
  try {
    await enqueueMailJob(id);
  } catch {
    // Redis is away: the row stays queued and the worker's sweep gives it a job.
  }
  return "queued";
}

/** Enqueues rows written with `enqueue: false`; never throws (the sweep catches what is left). */
export async function enqueueQueuedMails(ids: readonly string[]): Promise<void> {
  for (const id of ids) {
    try {
      await enqueueMailJob(id);
    } catch {
      return;
    }
  }
}
