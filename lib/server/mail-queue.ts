import { Queue, type JobsOptions } from "bullmq";
import type { Redis } from "ioredis";
import { getEnv } from "./env";
import { createRedis } from "./queue";

// The mail queue. A job carries the outbox row's id only; the row is the source of truth, and the
// worker's sweep re-enqueues queued rows that have no job (Redis was away when the mail was queued).

export const MAIL_QUEUE = "mail-delivery";
export const MAIL_ATTEMPTS = 8;
/** Exponential backoff: 2 s, 4 s, 8 s … about 4 min in all before a mail is marked failed. */
export const MAIL_BACKOFF_MS = 2_000;

export type MailJobData = { outboxId: string };

export function mailJobId(outboxId: string): string {
  return `mail-${outboxId}`;
}

export function mailJobOptions(): JobsOptions {
  return {
    attempts: MAIL_ATTEMPTS, backoff: { type: "exponential", delay: MAIL_BACKOFF_MS },
    removeOnComplete: true, removeOnFail: { age: 7 * 24 * 3600, count: 1000 },
  };
}

const globalForMail = globalThis as unknown as { emfolioMailQueue?: Queue<MailJobData>; emfolioMailRedis?: Redis };

export function getMailQueue(): Queue<MailJobData> {
  if (globalForMail.emfolioMailQueue) return globalForMail.emfolioMailQueue;
  const connection = createRedis("queue");
  globalForMail.emfolioMailRedis = connection;
  const queue = new Queue<MailJobData>(MAIL_QUEUE, { connection, prefix: getEnv().QUEUE_PREFIX });
  queue.on("error", () => undefined);
  globalForMail.emfolioMailQueue = queue;
  return queue;
}

/** Adds the job for an outbox row (once per row: the job id is the row's). Throws when Redis is down. */
export async function enqueueMailJob(outboxId: string): Promise<void> {
  await getMailQueue().add("send", { outboxId }, { ...mailJobOptions(), jobId: mailJobId(outboxId) });
}

export async function closeMailQueue(): Promise<void> {
  const queue = globalForMail.emfolioMailQueue;
  const redis = globalForMail.emfolioMailRedis;
  globalForMail.emfolioMailQueue = undefined;
  globalForMail.emfolioMailRedis = undefined;
  await queue?.close();
  redis?.disconnect();
}
