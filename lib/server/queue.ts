import { Queue, type JobsOptions } from "bullmq";
import { Redis } from "ioredis";
import { ANALYSIS_VERSION } from "@/lib/analysis";
import { getEnv } from "./env";

// The analysis queue. Jobs carry ids only; the capture row in PostgreSQL is the source of truth,
// so a lost job is re-created from the database by the worker's recovery sweep.

export const ANALYSIS_QUEUE = "capture-analysis";

export type AnalysisJobData = { captureId: string; labId: string };

/** Job states in which a job will still run (or is running) without anyone's help. */
export const LIVE_JOB_STATES = new Set(["waiting", "active", "delayed", "prioritized", "waiting-children"]);

/** Stable per capture and analysis version: enqueueing twice while a job is live adds nothing. */
export function analysisJobId(captureId: string, analysisVersion: string = ANALYSIS_VERSION): string {
  return `analyse-${captureId}-v${analysisVersion.replace(/[^\w.-]/g, "_")}`;
}

export function analysisJobOptions(): JobsOptions {
  return {
    attempts: getEnv().ANALYSIS_ATTEMPTS,
    backoff: { type: "exponential", delay: 2_000 },
    // The database keeps the outcome; Redis keeps only what is still to do, plus recent failures to inspect.
    removeOnComplete: true,
    removeOnFail: { age: 7 * 24 * 3600, count: 1000 },
  };
}

/** A Redis connection; workers need `maxRetriesPerRequest: null` so blocking commands never give up. */
export function createRedis(purpose: "queue" | "worker"): Redis {
  const redis = new Redis(getEnv().REDIS_URL, {
    maxRetriesPerRequest: purpose === "worker" ? null : 3,
    enableOfflineQueue: purpose === "worker",
  });
  redis.on("error", (err) => console.error(`Redis (${purpose}) error: ${err.message}`));
  return redis;
}

const globalForQueue = globalThis as unknown as {
  emfolioQueue?: Queue<AnalysisJobData>; emfolioQueueRedis?: Redis; emfolioPendingEnqueues?: Map<string, AnalysisJobData>;
};

/** Jobs this process could not add (Redis down); bounded, since the worker's sweep finds them anyway. */
const MAX_PENDING = 10_000;

function pendingEnqueues(): Map<string, AnalysisJobData> {
  globalForQueue.emfolioPendingEnqueues ??= new Map();
  return globalForQueue.emfolioPendingEnqueues;
}

/** Adds the jobs that failed to enqueue while Redis was away, as soon as the connection is back. */
async function retryPendingEnqueues(): Promise<void> {
  const pending = pendingEnqueues();
  for (const [captureId, data] of [...pending]) {
    try {
      await enqueueAnalysis(data);
      pending.delete(captureId);
    } catch {
      return;
    }
  }
}

export function getAnalysisQueue(): Queue<AnalysisJobData> {
  if (globalForQueue.emfolioQueue) return globalForQueue.emfolioQueue;
  // Producers fail fast when Redis is down; the capture stays queued in the database, and the job
  // is added when this connection is ready again (or by the worker's sweep, whichever comes first).
  const connection = createRedis("queue");
  connection.on("ready", () => void retryPendingEnqueues());
  globalForQueue.emfolioQueueRedis = connection;
  const queue = new Queue<AnalysisJobData>(ANALYSIS_QUEUE, { connection, prefix: getEnv().QUEUE_PREFIX });
  // One line per problem (the connection's own listener above says which); no stack dumps in the web log.
  queue.on("error", () => undefined);
  globalForQueue.emfolioQueue = queue;
  return queue;
}

/**
 * Adds the analysis job unless one is live. A finished job of the same id (failed for good) is
 * removed first so a deliberate re-run is not swallowed by the id it shares.
 */
export async function enqueueAnalysis(data: AnalysisJobData): Promise<"added" | "already-live"> {
  const queue = getAnalysisQueue();
  const jobId = analysisJobId(data.captureId);
  const existing = await queue.getJob(jobId);
  if (existing) {
    const state = await existing.getState();
    if (LIVE_JOB_STATES.has(state)) return "already-live";
    await existing.remove().catch(() => undefined);
  }
  await queue.add("analyse", data, { ...analysisJobOptions(), jobId });
  return "added";
}

/** enqueueAnalysis for request paths: never throws; a job Redis did not take is retried on reconnect. */
export async function enqueueAnalysisOrLater(data: AnalysisJobData): Promise<"added" | "already-live" | "later"> {
  try {
    return await enqueueAnalysis(data);
  } catch (err) {
    console.error(`enqueue ${data.captureId} deferred: ${err instanceof Error ? err.message : String(err)}`);
    const pending = pendingEnqueues();
    if (pending.size < MAX_PENDING) pending.set(data.captureId, data);
    return "later";
  }
}

/** The state of a capture's job as Redis sees it ("missing" after a flush or once removed). */
export async function getAnalysisJobState(captureId: string): Promise<{ state: string; failedReason?: string }> {
  const job = await getAnalysisQueue().getJob(analysisJobId(captureId));
  if (!job) return { state: "missing" };
  return { state: await job.getState(), failedReason: job.failedReason };
}

/** Pings Redis over the producer's own connection (readiness); fails fast while it is down. */
/** How long a ping waits for a connection still being opened (the first check after start). */
const PING_CONNECT_WAIT_MS = 3_000;

export async function pingQueue(): Promise<void> {
  getAnalysisQueue();
  const redis = globalForQueue.emfolioQueueRedis;
  // The queue connection has no offline queue, so a command sent before it is ready fails at once:
  // the first readiness check after start would report Redis down when it is only connecting.
  if (redis && (redis.status === "connecting" || redis.status === "connect" || redis.status === "wait")) {
    await new Promise<void>((resolve) => {
      const timer = setTimeout(done, PING_CONNECT_WAIT_MS);
      function done() { clearTimeout(timer); redis?.off("ready", done); resolve(); }
      redis.once("ready", done);
    });
  }
  await redis?.ping();
}

export async function closeAnalysisQueue(): Promise<void> {
  const queue = globalForQueue.emfolioQueue;
  const redis = globalForQueue.emfolioQueueRedis;
  globalForQueue.emfolioQueue = undefined;
  globalForQueue.emfolioQueueRedis = undefined;
  await queue?.close();
  redis?.disconnect();
}
