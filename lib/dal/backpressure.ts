import "server-only";
import { countAnalysisBacklog } from "@/db/queries/captures";
import { HttpError } from "@/lib/auth/guards";
import { getEnv } from "@/lib/server/env";

// Backpressure for the bench API: while the analysis backlog is deeper than ANALYSIS_BACKLOG_LIMIT,
// a new registration is answered 429 with Retry-After, so bench PCs hold their files instead of
// piling uploads onto workers that cannot keep up. The count is shared for a moment between requests.

const COUNT_TTL_MS = 2_000;
export const BACKLOG_RETRY_AFTER_S = 30;

const counted: { at: number; value: number; running?: Promise<number> } = { at: 0, value: 0 };

async function backlog(): Promise<number> {
  if (Date.now() - counted.at < COUNT_TTL_MS) return counted.value;
  counted.running ??= countAnalysisBacklog(getEnv().ANALYSIS_BACKLOG_LIMIT + 1)
    .then((value) => Object.assign(counted, { value, at: Date.now() }).value)
    .finally(() => (counted.running = undefined));
  return counted.running;
}

/** Throws 429 with Retry-After while the backlog is over the limit. */
export async function refuseWhenBacklogFull(): Promise<void> {
  const limit = getEnv().ANALYSIS_BACKLOG_LIMIT;
  if ((await backlog()) > limit) {
    throw new HttpError(429, `More than ${limit} captures are waiting for analysis: hold this file and send it again in ${BACKLOG_RETRY_AFTER_S} s`, BACKLOG_RETRY_AFTER_S);
  }
}

/** Forgets the shared count (tests). */
export function resetBacklogCount(): void {
  counted.at = 0;
}
