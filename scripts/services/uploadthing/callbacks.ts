/**
 * What the fake remembers between the app's `/route-metadata` registration, the browser's PUT and
 * the app's `/callback-result`, and how it tells the app that a file arrived.
 *
 * uploadthing 7.7.4 (src/_internal/handler.ts) has two modes, chosen by the app's `isDev`:
 * - production: the service POSTs the signed callback to the app's `callbackUrl?slug=…`;
 * - development: the `/route-metadata` response stays open as JSON lines, one
 *   `{ payload, signature, hook }` per file, and the app forwards each to itself.
 * Either way the app then runs `onUploadComplete` and POSTs `{ fileKey, callbackData }` to
 * `<origin>/callback-result`; with `awaitServerData` the browser's PUT waits for that.
 * State is in memory: a restart forgets uploads in flight, not stored files.
 */
import type { ServerResponse } from "node:http";
import { signPayload } from "./signing";
import type { StoredFile } from "./store";

export type Registration = {
  appId: string;
  metadata: unknown;
  isDev: boolean;
  callbackUrl: string;
  callbackSlug: string;
  awaitServerData: boolean;
  stream: DevStream | null;
};

type DevStream = { res: ServerResponse; open: Set<string> };
type Waiter<T> = { resolve: (v: T) => void; timer: NodeJS.Timeout };

const registrations = new Map<string, Registration>();
const registrationWaiters = new Map<string, Waiter<Registration | null>[]>();
const results = new Map<string, { callbackData: unknown } | { error: string }>();
const resultWaiters = new Map<string, Waiter<{ callbackData: unknown } | { error: string } | null>[]>();

function wake<T>(map: Map<string, Waiter<T>[]>, key: string, value: T) {
  for (const w of map.get(key) ?? []) {
    clearTimeout(w.timer);
    w.resolve(value);
  }
  map.delete(key);
}

function waitFor<T>(map: Map<string, Waiter<T | null>[]>, key: string, timeoutMs: number): Promise<T | null> {
  return new Promise((resolve) => {
    const timer = setTimeout(() => {
      map.set(key, (map.get(key) ?? []).filter((w) => w.timer !== timer));
      resolve(null);
    }, timeoutMs);
    map.set(key, [...(map.get(key) ?? []), { resolve, timer }]);
  });
}

export function register(fileKeys: string[], reg: Omit<Registration, "stream">, res: ServerResponse | null): void {
  const stream = reg.isDev && res ? { res, open: new Set(fileKeys) } : null;
  for (const key of fileKeys) {
    registrations.set(key, { ...reg, stream });
    wake(registrationWaiters, key, registrations.get(key) ?? null);
  }
}

/** The registration of a key; the app sends it while the browser already uploads, so wait a little. */
export async function registrationOf(key: string, timeoutMs = 15_000): Promise<Registration | null> {
  return registrations.get(key) ?? waitFor(registrationWaiters, key, timeoutMs);
}

export function recordResult(key: string, result: { callbackData: unknown } | { error: string }): void {
  results.set(key, result);
  wake(resultWaiters, key, result);
}

export async function resultOf(key: string, timeoutMs: number) {
  return results.get(key) ?? waitFor(resultWaiters, key, timeoutMs);
}

export function forget(key: string): void {
  registrations.delete(key);
  results.delete(key);
}

function closeStreamFor(reg: Registration, key: string) {
  if (!reg.stream) return;
  reg.stream.open.delete(key);
  if (reg.stream.open.size === 0 && !reg.stream.res.writableEnded) reg.stream.res.end();
}

/** The body of the "callback" hook, as the SDK's handleCallbackRequest decodes it. */
export function callbackBody(file: StoredFile, reg: Registration, origin: string, fileUrl: string, appUrl: string): string {
  return JSON.stringify({
    status: "uploaded",
    metadata: reg.metadata,
    origin,
    file: {
      name: file.name, size: file.size, type: file.type, customId: file.customId, key: file.key,
      lastModified: file.lastModified ?? undefined, fileHash: file.fileHash, url: fileUrl, appUrl, ufsUrl: appUrl,
    },
  });
}

/**
 * Delivers a signed hook to the app: over the dev stream, or as a POST to its callback URL.
 * Resolves to null when delivered, else to a message naming what went wrong.
 */
export async function deliverHook(reg: Registration, key: string, hook: "callback" | "error", body: string, apiKey: string): Promise<string | null> {
  const signature = signPayload(body, apiKey);
  if (reg.stream) {
    const { res } = reg.stream;
    if (res.writableEnded || res.destroyed) return "the app's development stream has closed";
    res.write(`${JSON.stringify({ payload: body, signature, hook })}\n`);
    closeStreamFor(reg, key);
    return null;
  }
  try {
    const res = await fetch(reg.callbackUrl, {
      method: "POST",
      headers: { "content-type": "application/json", "uploadthing-hook": hook, "x-uploadthing-signature": signature },
      body,
    });
    await res.arrayBuffer();
    return res.ok ? null : `the app answered the ${hook} hook with ${res.status}`;
  } catch (err) {
    return `the app's callback URL ${reg.callbackUrl} did not answer: ${err instanceof Error ? err.message : String(err)}`;
  }
}
