/**
 * Signatures as uploadthing 7.7.4 makes them (@uploadthing/shared, src/crypto.ts), checked with
 * node:crypto rather than the SDK so the fake is an independent check of the app's signing:
 *
 * - a payload signature is `hmac-sha256=` + hex(HMAC-SHA256(key = the app's apiKey, payload));
 * - a presigned URL carries `expires` (ms since the epoch) and its `x-ut-*` fields as query
 *   parameters, and `signature` is appended last over the URL's string form without it.
 *
 * Pure: no I/O; the clock comes in as an argument.
 */
import { createHmac, timingSafeEqual } from "node:crypto";

const PREFIX = "hmac-sha256=";

export function signPayload(payload: string, apiKey: string): string {
  return PREFIX + createHmac("sha256", apiKey).update(payload, "utf8").digest("hex");
}

export function verifySignature(payload: string, signature: string | null | undefined, apiKey: string): boolean {
  if (!signature?.startsWith(PREFIX)) return false;
  const given = signature.slice(PREFIX.length);
  if (!/^[0-9a-f]{64}$/i.test(given)) return false;
  const want = createHmac("sha256", apiKey).update(payload, "utf8").digest();
  return timingSafeEqual(Buffer.from(given, "hex"), want);
}

export type SignedUrlCheck =
  | { ok: true; params: URLSearchParams; expiresAtMs: number }
  | { ok: false; status: 400 | 403; reason: string };

/** The query parameters of a presigned URL before they were signed (the SDK encodes each value once more). */
export function signedField(params: URLSearchParams, name: string): string | null {
  const raw = params.get(name);
  if (raw === null) return null;
  try {
    return decodeURIComponent(raw);
  } catch {
    return null;
  }
}

/**
 * Checks a presigned URL as the browser sent it: `fullUrl` is the scheme and Host header the request
 * arrived with plus the request target. `apiKeyFor` gives the key of the app the URL names (or null).
 */
export function verifySignedUrl(
  fullUrl: string,
  apiKeyFor: (params: URLSearchParams) => string | null,
  nowMs: number,
): SignedUrlCheck {
  let url: URL;
  try {
    url = new URL(fullUrl);
  } catch {
    return { ok: false, status: 400, reason: "not a URL" };
  }
  const signature = url.searchParams.get("signature");
  if (!signature) return { ok: false, status: 403, reason: "the URL is not signed" };
  url.searchParams.delete("signature");
  const apiKey = apiKeyFor(url.searchParams);
  if (!apiKey) return { ok: false, status: 403, reason: "unknown app" };
  if (!verifySignature(url.toString(), signature, apiKey)) return { ok: false, status: 403, reason: "invalid signature" };
  const expires = Number(url.searchParams.get("expires"));
  if (!Number.isFinite(expires) || expires <= 0) return { ok: false, status: 400, reason: "missing expires" };
  if (expires < nowMs) return { ok: false, status: 403, reason: "the URL has expired" };
  return { ok: true, params: url.searchParams, expiresAtMs: expires };
}

/** `bytes=N-` as the SDK's client sends it; null for anything else. */
export function parseRangeStart(header: string | undefined): number | null {
  if (header === undefined || header === "") return 0;
  const m = /^bytes=(\d+)-$/.exec(header.trim());
  if (!m) return null;
  const n = Number(m[1]);
  return Number.isSafeInteger(n) ? n : null;
}
