import "server-only";

// The public verification page's limit per client address, kept in the web process: a fixed window of
// WINDOW_MS with at most LIMIT look-ups. Each web process counts on its own (a few processes multiply
// the limit); the sign-in attempts table is for failed passwords and is not touched by visitors.

export const VERIFY_LIMIT = 30;
export const VERIFY_WINDOW_MS = 60_000;
const MAX_ADDRESSES = 10_000;

type Window = { start: number; count: number };
const globalForLimit = globalThis as unknown as { emfolioVerifyWindows?: Map<string, Window> };

function windows(): Map<string, Window> {
  globalForLimit.emfolioVerifyWindows ??= new Map();
  return globalForLimit.emfolioVerifyWindows;
}

/** Counts one look-up from `address` at `now`; false when the address is over the limit for this window. */
export function allowVerifyLookup(address: string, now = Date.now()): boolean {
  const map = windows();
  const current = map.get(address);
  if (!current || now - current.start >= VERIFY_WINDOW_MS) {
    // Bounded memory: stale windows are dropped when the map grows large.
    if (map.size >= MAX_ADDRESSES) for (const [key, w] of map) if (now - w.start >= VERIFY_WINDOW_MS) map.delete(key);
    if (map.size >= MAX_ADDRESSES) map.clear();
    map.set(address, { start: now, count: 1 });
    return true;
  }
  current.count += 1;
  return current.count <= VERIFY_LIMIT;
}

export function resetVerifyLimits(): void {
  windows().clear();
}
