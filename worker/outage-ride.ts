import { logDetail, ServiceOutage } from "@/lib/server/outage";

// Riding out an outage: a step that failed because a service did not answer is tried again with a
// capped backoff, for as long as `maxWaitMs`, without spending one of the job's attempts. The job
// keeps its slot meanwhile, so a worker whose services are down stops taking new work and resumes
// by itself when they answer.

export type RideOptions = {
  maxWaitMs: number;
  /** Told before each wait (best effort: it may itself fail while the service is down). */
  onWait?: (outage: ServiceOutage, waitedMs: number) => Promise<void> | void;
  sleep?: (ms: number) => Promise<void>;
  now?: () => number;
  log?: (line: string) => void;
};

const FIRST_DELAY_MS = 500;
/** Long enough not to hammer a restarting service, short enough to resume within seconds. */
export const MAX_DELAY_MS = 5_000;

/** The wait before try `n` (0-based): 0.5 s, 1 s, 2 s … capped at MAX_DELAY_MS. */
export function rideDelayMs(n: number): number {
  return Math.min(MAX_DELAY_MS, FIRST_DELAY_MS * 2 ** Math.min(n, 20));
}

const realSleep = (ms: number) => new Promise<void>((resolve) => setTimeout(resolve, ms));

/** Runs `step`; on a ServiceOutage waits and tries again until `maxWaitMs` has passed, then throws the outage. */
export async function rideOutages<T>(what: string, step: () => Promise<T>, options: RideOptions): Promise<T> {
  const now = options.now ?? Date.now;
  const sleep = options.sleep ?? realSleep;
  const log = options.log ?? ((line: string) => console.error(line));
  const started = now();
  for (let n = 0; ; n++) {
    try {
      return await step();
    } catch (err) {
      if (!(err instanceof ServiceOutage)) throw err;
      const waited = now() - started;
      if (waited >= options.maxWaitMs) throw err;
      const delay = Math.min(rideDelayMs(n), Math.max(0, options.maxWaitMs - waited));
      log(`${what}: ${err.service} unreachable (${logDetail(err.cause)}); trying again in ${(delay / 1000).toFixed(1)} s`);
      await Promise.resolve(options.onWait?.(err, waited)).catch(() => undefined);
      await sleep(delay);
    }
  }
}
