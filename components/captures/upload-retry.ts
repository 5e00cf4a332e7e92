// When an upload to the object store is tried again: a lost connection, 429 and 5xx answers are
// worth another try (after Retry-After when the store sends one, otherwise a growing pause); any
// other answer is final. Bounded, so a store that stays away ends in a message, not a spinner.

export const MAX_TRIES = 6;
const BACKOFF_MS = [1000, 2000, 4000, 8000, 15_000];
const MAX_WAIT_MS = 60_000;

/** A failed PUT: the store's status (0 for no answer), its error code and Retry-After header. */
export class StoreAnswerError extends Error {
  constructor(readonly status: number, readonly code: string | null, readonly retryAfter: string | null, message: string) {
    super(message);
  }
}

export function isRetryable(err: unknown): boolean {
  if (!(err instanceof StoreAnswerError)) return false;
  return err.status === 0 || err.status === 429 || err.status >= 500;
}

/** Milliseconds before try number `tryNumber + 1`, from Retry-After (seconds or an HTTP date) or the backoff table. */
export function retryDelayMs(err: StoreAnswerError, tryNumber: number, now = Date.now()): number {
  if (err.retryAfter) {
    const seconds = Number(err.retryAfter);
    const ms = Number.isFinite(seconds) ? seconds * 1000 : Date.parse(err.retryAfter) - now;
    if (Number.isFinite(ms)) return Math.min(Math.max(ms, 0), MAX_WAIT_MS);
  }
  return BACKOFF_MS[Math.min(tryNumber - 1, BACKOFF_MS.length - 1)] ?? MAX_WAIT_MS;
}

/**
 * Runs `attempt` until it succeeds, fails for good, or MAX_TRIES are spent; `onWait` hears each
 * pause. The last error is rethrown with how many tries were made.
 */
export async function withRetries<T>(what: string, attempt: (tryNumber: number) => Promise<T>, onWait?: (ms: number, err: StoreAnswerError) => void, sleep = (ms: number) => new Promise<void>((r) => setTimeout(r, ms))): Promise<T> {
  for (let tryNumber = 1; ; tryNumber++) {
    try {
      return await attempt(tryNumber);
    } catch (err) {
      if (!isRetryable(err) || !(err instanceof StoreAnswerError)) throw err;
      if (tryNumber >= MAX_TRIES) throw new Error(`${what}: the object store did not take it after ${tryNumber} tries (last answer: ${err.message}); try again later`);
      const ms = retryDelayMs(err, tryNumber);
      onWait?.(ms, err);
      await sleep(ms);
    }
  }
}
