import { Worker, type Job } from "bullmq";
import type { Redis } from "ioredis";
import { getEnv } from "@/lib/server/env";
import { deliverOutboxMail } from "@/lib/server/mail-delivery";
import { MAIL_QUEUE, type MailJobData } from "@/lib/server/mail-queue";

// Sends queued mails in the worker process (in-process: a send is a short network call, not CPU work).

export function startMailWorker(connection: Redis, log: (line: string) => void): Worker<MailJobData> {
  const worker = new Worker<MailJobData>(
    MAIL_QUEUE,
    async (job: Job<MailJobData>) => ({ outcome: await deliverOutboxMail(job.data.outboxId, job.attemptsMade + 1, job.opts.attempts ?? 1) }),
    { connection, prefix: getEnv().QUEUE_PREFIX, concurrency: 2 },
  );
  worker.on("error", (err) => console.error(`mail worker error: ${err.message}`));
  worker.on("failed", (job, err) => {
    if (job) log(`${job.id} failed (attempt ${job.attemptsMade}): ${err.message}`);
  });
  return worker;
}
