/**
 * How long a sign-in for an account waits after `failures` recent failed attempts: nothing for the
 * first `free`, then 1 s doubling per further failure, at most `capMs`. A delay instead of a lock: the
 * rightful owner still signs in (a little later), so nobody can lock someone else out by guessing.
 */
export function signInDelayMs(failures: number, free: number, capMs = 16_000): number {
  if (failures < free) return 0;
  return Math.min(capMs, 1000 * 2 ** (failures - free));
}
