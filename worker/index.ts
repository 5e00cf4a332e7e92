import path from "node:path";
import { Worker, type Job } from "bullmq";
import { closeDb } from "@/db/queries/connection";
import { setCaptureState } from "@/db/queries/captures";
import { getEnv } from "@/lib/server/env";
import { ANALYSIS_QUEUE, closeAnalysisQueue, createRedis, type AnalysisJobData } from "@/lib/server/queue";
import { logDetail } from "@/lib/server/outage";
import { enqueueQueuedMails } from "@/lib/server/mail-outbox";
import { closeMailQueue } from "@/lib/server/mail-queue";
import { mailIdsOf, sweepMail } from "./mail-sweep";
import { startMailWorker } from "./mail-worker";
import { sweepAbandonedUploads } from "./abandoned-uploads";
import { queueCalibrationReminders } from "./calibration-reminders";
import { failureMessage, isOutageReason } from "./processors/messages";
import { sweepAbandonedCaptures } from "./recovery";

// The analysis worker: its own process beside the web app (`npm run worker`, or `node --import tsx worker/index.ts`).
// Parsing and analysis run in sandboxed child processes, one per concurrent job.

const env = getEnv();
const SHUTDOWN_GRACE_MS = 30_000;
const log = (message: string) => console.log(`${new Date().toISOString()} worker: ${message}`);

const connection = createRedis("worker");
const processorFile = path.join(import.meta.dirname, "processors", "analyse-capture.ts");

const worker = new Worker<AnalysisJobData>(ANALYSIS_QUEUE, processorFile, {
  connection,
  prefix: env.QUEUE_PREFIX,
  concurrency: env.WORKER_CONCURRENCY,
  lockDuration: env.WORKER_LOCK_MS,
  stalledInterval: env.WORKER_LOCK_MS,
  // A job whose worker died is taken over by the next stalled check, twice at most.
  maxStalledCount: 2,
});

const mailWorker = startMailWorker(connection, log);

worker.on("error", (err) => console.error(`worker error: ${err.message}`));
worker.on("completed", (job: Job<AnalysisJobData>, result: unknown) => {
  log(`${job.id} ${JSON.stringify(result)}`);
  void enqueueQueuedMails(mailIdsOf(result));
});
worker.on("failed", (job: Job<AnalysisJobData> | undefined, err: Error) => {
  if (!job) return;
  const outage = isOutageReason(err.message);
  const final = !outage && (err.name === "UnrecoverableError" || job.attemptsMade >= (job.opts.attempts ?? 1));
  log(`${job.id} failed (attempt ${job.attemptsMade}${final ? ", final" : ""}): ${err.message}`);
  if (outage) {
    // Not the capture's fault: the sweep enqueues it again once the services answer.
    scheduleSweep("after an outage", 2_000);
    return;
  }
  if (!final || err.name === "UnrecoverableError") return;
  // The processor records its own outcomes; this covers a child process that died before it could.
  void setCaptureState({ kind: "lab", labId: job.data.labId }, job.data.captureId, "failed", ["queued", "analysing"], {
    progress: 0,
    stateMessage: failureMessage(err, job.attemptsMade, job.opts.attempts ?? 1),
  }).catch((e: unknown) => console.error(`could not record the failure of ${job.id}: ${logDetail(e)}`));
});

let stopping = false;
let sweeping: Promise<void> | null = null;
let soon: NodeJS.Timeout | null = null;
/** The UTC day calibration reminders were last queued for (daily; the outbox dedupes anyway). */
let remindedOn: string | null = null;

/** One sweep at a time; a sweep asked for while one runs is folded into it. */
function sweep(reason: string): Promise<void> {
  sweeping ??= runSweep(reason).finally(() => (sweeping = null));
  return sweeping;
}

/** A sweep shortly (after a reconnect, a failed enqueue or an outage), at most one pending. */
function scheduleSweep(reason: string, delayMs: number): void {
  if (soon || stopping) return;
  soon = setTimeout(() => {
    soon = null;
    void sweep(reason);
  }, delayMs);
}

async function runSweep(reason: string): Promise<void> {
  try {
    const r = await sweepAbandonedCaptures();
    if (r.requeued || r.markedFailed) log(`sweep (${reason}): ${r.checked} waiting, ${r.requeued} re-enqueued, ${r.markedFailed} marked failed`);
    // Enqueueing failed (Redis went away mid-sweep): look again soon rather than a period later.
    if (r.enqueueFailed) scheduleSweep("after a failed enqueue", 2_000);
    const u = await sweepAbandonedUploads(env.UPLOAD_ABANDON_HOURS * 3_600_000);
    if (u.removed) log(`sweep (${reason}): ${u.removed} upload(s) abandoned over ${env.UPLOAD_ABANDON_HOURS} h ago removed`);
    if (u.partsLeft) log(`sweep (${reason}): the object store cannot abort multipart uploads; parts of ${u.partsLeft} upload(s) stay there (use a lifecycle rule)`);
    for (const e of u.storageErrors) console.error(`sweep (${reason}): could not clean storage of an abandoned upload: ${e}`);
    const today = new Date().toISOString().slice(0, 10);
    if (remindedOn !== today) {
      const queued = await queueCalibrationReminders(today, env.NEXTAUTH_URL ?? "");
      remindedOn = today;
      if (queued) log(`sweep (${reason}): ${queued} calibration reminder(s) queued`);
    }
    await sweepMail(reason, log);
  } catch (err) {
    console.error(`sweep (${reason}) failed: ${logDetail(err)}`);
    scheduleSweep(`retry of the ${reason} sweep`, 5_000);
  }
}

const sweepTimer = setInterval(() => void sweep("periodic"), env.WORKER_SWEEP_INTERVAL_S * 1000);
let started = false;
void worker.waitUntilReady().then(async () => {
  log(`ready: queue ${env.QUEUE_PREFIX}:${ANALYSIS_QUEUE}, concurrency ${env.WORKER_CONCURRENCY}`);
  started = true;
  await sweep("start");
});
// Redis came back (perhaps empty, after a restart or a flush): give the database's waiting captures
// their jobs now rather than a sweep period later.
connection.on("ready", () => {
  if (!started) return;
  log("Redis connection ready again");
  scheduleSweep("Redis reconnected", 500);
});

async function shutdown(signal: string): Promise<void> {
  if (stopping) {
    log(`${signal} again: exiting now`);
    process.exit(1);
  }
  stopping = true;
  log(`${signal}: finishing the running jobs, then stopping`);
  clearInterval(sweepTimer);
  if (soon) clearTimeout(soon);
  // A job stuck on a dead connection must not keep the process alive: its lock expires and the
  // next worker takes it over, so leaving is safe.
  setTimeout(() => {
    log(`still busy after ${SHUTDOWN_GRACE_MS / 1000} s: exiting; unfinished jobs will be taken over`);
    process.exit(1);
  }, SHUTDOWN_GRACE_MS).unref();
  try {
    await Promise.all([worker.close(), mailWorker.close()]);
    await closeAnalysisQueue();
    await closeMailQueue();
    await connection.quit();
    await closeDb();
  } catch (err) {
    console.error(`shutdown: ${err instanceof Error ? err.message : String(err)}`);
    process.exitCode = 1;
  }
  log("stopped");
}

process.on("SIGTERM", () => void shutdown("SIGTERM"));
process.on("SIGINT", () => void shutdown("SIGINT"));
