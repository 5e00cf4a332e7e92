import { HeadBucketCommand } from "@aws-sdk/client-s3";
import { createConnection } from "node:net";
import { pingDatabase } from "@/db/queries/health";
import { getEnv } from "./env";
import { pingQueue } from "./queue";
import { getS3 } from "./storage";
import { pingAttachmentStore } from "./uploadthing";

// Readiness for load balancers: one check of each service at most every CACHE_MS, shared by every
// request in between (so a burst of probes never becomes a burst on the services), over the
// connections the app already holds. Mail and attachments are reported but do not decide
// readiness: without them the app still takes uploads and serves reports.

export type ServiceState = "up" | "slow" | "down";
export type Readiness = { ready: boolean; checkedAt: string; services: Record<string, ServiceState> };

const CACHE_MS = 5_000;
/** An answer slower than this is "slow"; only a refusal, an error, or slowness several checks running is "down". */
const SLOW_MS = 2_000;
const SLOW_CHECKS_BEFORE_DOWN = 3;

type Check = { service: string; required: boolean; run: () => Promise<unknown> };

function checks(): Check[] {
  const env = getEnv();
  return [
    { service: "database", required: true, run: pingDatabase },
    { service: "queue", required: true, run: pingQueue },
    { service: "file store", required: true, run: () => getS3().send(new HeadBucketCommand({ Bucket: env.S3_BUCKET })) },
    { service: "mail", required: false, run: () => new Promise<void>((resolve, reject) => {
      const socket = createConnection({ host: env.SMTP_HOST, port: env.SMTP_PORT }, () => { socket.end(); resolve(); });
      socket.setTimeout(SLOW_MS * 2, () => socket.destroy(new Error("no answer")));
      socket.on("error", reject);
    }) },
    { service: "attachments", required: false, run: pingAttachmentStore },
  ];
}

type Cache = { value?: Readiness; at: number; running?: Promise<Readiness>; slowRuns: Map<string, number> };
// On globalThis: scripts/serve.ts (loaded by tsx) and Next's bundle (the /api/health route) each hold
// their own copy of this module, and must share one measurement.
const globalForReadiness = globalThis as unknown as { emfolioReadiness?: Cache };
const cache: Cache = (globalForReadiness.emfolioReadiness ??= { at: 0, slowRuns: new Map() });
const slowRuns = cache.slowRuns;

async function probe(check: Check): Promise<ServiceState> {
  let timer: NodeJS.Timeout | undefined;
  const slow = new Promise<"slow">((resolve) => (timer = setTimeout(() => resolve("slow"), SLOW_MS)));
  const answer = check.run().then(() => "up" as const, () => "down" as const);
  // A slow answer still lands later; the next check sees whether it was up.
  answer.catch(() => undefined);
  const state = await Promise.race([answer, slow]);
  clearTimeout(timer);
  const runs = state === "slow" ? (slowRuns.get(check.service) ?? 0) + 1 : 0;
  slowRuns.set(check.service, runs);
  return state === "slow" && runs >= SLOW_CHECKS_BEFORE_DOWN ? "down" : state;
}

async function measure(): Promise<Readiness> {
  const list = checks();
  const states = await Promise.all(list.map(probe));
  const ready = list.every((c, i) => !c.required || states[i] !== "down");
  return { ready, checkedAt: new Date().toISOString(), services: Object.fromEntries(list.map((c, i) => [c.service, states[i] ?? "down"])) };
}

/**
 * The services' states, measured at most every CACHE_MS. Concurrent callers share one measurement,
 * and once there is a result nobody waits for the next one: an expired result is answered while a
 * fresh one is measured (so a probe's latency never includes a slow service's).
 */
export async function getReadiness(now = Date.now()): Promise<Readiness> {
  if (cache.value && now - cache.at < CACHE_MS) return cache.value;
  cache.running ??= measure().then((value) => {
    cache.value = value;
    cache.at = Date.now();
    return value;
  }).finally(() => (cache.running = undefined));
  return cache.value ?? cache.running;
}
