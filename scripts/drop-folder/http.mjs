// HTTP for the drop-folder uploader: JSON calls to the bench API and ranged PUTs to storage.
import { createHash } from "node:crypto";
import { createReadStream } from "node:fs";
import http from "node:http";
import https from "node:https";
import { setTimeout as sleep } from "node:timers/promises";

/** Worth trying again later: the network, a busy or unavailable server. */
export class TransientError extends Error {
  constructor(message, retryAfterMs = null) {
    super(message);
    this.retryAfterMs = retryAfterMs;
  }
}

/** The server answered with a refusal; `status` says which. */
export class HttpStatusError extends Error {
  constructor(status, message) {
    super(message);
    this.status = status;
  }
}

/** Retry-After in seconds or as an HTTP date, in milliseconds (capped at 10 minutes). */
export function retryAfterMs(header, now = Date.now()) {
  if (!header) return null;
  const seconds = Number(header);
  const ms = Number.isFinite(seconds) ? seconds * 1000 : Date.parse(header) - now;
  return Number.isFinite(ms) ? Math.min(Math.max(ms, 0), 600_000) : null;
}

function classify(status, message, headers) {
  // 409 with Retry-After: an earlier try of this upload still holds its lease (the server says when to come back).
  const busy = status === 409 && headers["retry-after"] !== undefined;
  if (status === 429 || status === 503 || busy) return new TransientError(`${status}: ${message}`, retryAfterMs(headers["retry-after"] ?? null));
  if (status >= 500) return new TransientError(`${status}: ${message}`);
  return new HttpStatusError(status, message);
}

function send(url, { method, headers, body, onWrite, limitBytesPerS }) {
  return new Promise((resolve, reject) => {
    const target = new URL(url);
    const request = (target.protocol === "https:" ? https : http).request(target, { method, headers, timeout: 120_000 }, (response) => {
      const chunks = [];
      response.on("data", (chunk) => chunks.push(chunk));
      response.on("end", () => resolve({ status: response.statusCode ?? 0, headers: response.headers, text: Buffer.concat(chunks).toString("utf8") }));
      response.on("error", (error) => reject(new TransientError(`connection lost: ${error.message}`)));
    });
    request.on("timeout", () => request.destroy(new Error("no answer in 120 s")));
    request.on("error", (error) => reject(new TransientError(`${target.host}: ${error.code ?? error.message}`)));
    if (!body) return request.end();
    if (typeof body === "string") return request.end(body);
    let sent = 0;
    let held = false;
    const started = Date.now();
    body.on("data", (chunk) => {
      sent += chunk.length;
      onWrite?.(chunk.length);
      if (!request.write(chunk)) body.pause();
      const ahead = limitBytesPerS > 0 ? (sent / limitBytesPerS) * 1000 - (Date.now() - started) : 0;
      if (ahead > 0) {
        held = true;
        body.pause();
        setTimeout(() => {
          held = false;
          body.resume();
        }, ahead);
      }
    });
    request.on("drain", () => {
      if (!held) body.resume();
    });
    body.on("end", () => request.end());
    body.on("error", (error) => request.destroy(error));
  });
}

/** A JSON call to the bench API with the station key. */
export async function callApi(server, key, method, path, payload) {
  const body = payload === undefined ? undefined : JSON.stringify(payload);
  const headers = { Authorization: `Bearer ${key}`, Accept: "application/json", ...(body ? { "Content-Type": "application/json", "Content-Length": Buffer.byteLength(body) } : {}) };
  const response = await send(`${server}${path}`, { method, headers, body });
  let json = null;
  try {
    json = JSON.parse(response.text);
  } catch {
    json = null;
  }
  if (response.status >= 200 && response.status < 300) return { status: response.status, json };
  throw classify(response.status, json?.error ?? `HTTP ${response.status}`, response.headers);
}

/** The sha256 (hex) of bytes [start, end) of a file. */
export function sha256Range(file, start, end) {
  return new Promise((resolve, reject) => {
    const hash = createHash("sha256");
    createReadStream(file, { start, end: end - 1, highWaterMark: 256 * 1024 }).on("data", (c) => hash.update(c)).on("end", () => resolve(hash.digest("hex"))).on("error", reject);
  });
}

export const MAX_TRIES = 5;
const TRY_BACKOFF_MS = [1000, 2000, 4000, 8000];

/**
 * Runs `attempt` again after a TransientError (Retry-After when given, else a growing pause), at most
 * MAX_TRIES times; then gives up with a TransientError that says how often it tried and why.
 */
export async function withRetries(what, attempt, onWait) {
  for (let tryNumber = 1; ; tryNumber++) {
    try {
      return await attempt();
    } catch (error) {
      if (!(error instanceof TransientError)) throw error;
      if (tryNumber >= MAX_TRIES) throw new TransientError(`${what}: gave up after ${tryNumber} tries (last: ${error.message})`, error.retryAfterMs);
      const wait = error.retryAfterMs ?? TRY_BACKOFF_MS[Math.min(tryNumber - 1, TRY_BACKOFF_MS.length - 1)];
      onWait?.(wait, error, tryNumber);
      await sleep(wait);
    }
  }
}

/** PUTs bytes [start, end) of a file to a presigned URL; returns the ETag. */
export async function putRange(url, file, start, end, extraHeaders, onWrite, limitBytesPerS) {
  const body = createReadStream(file, { start, end: end - 1, highWaterMark: 256 * 1024 });
  const headers = { ...extraHeaders, "Content-Length": end - start };
  const response = await send(url, { method: "PUT", headers, body, onWrite, limitBytesPerS });
  if (response.status >= 200 && response.status < 300) return String(response.headers.etag ?? "");
  const code = /<Code>([^<]+)<\/Code>/.exec(response.text)?.[1] ?? `HTTP ${response.status}`;
  throw classify(response.status, `storage refused the upload: ${code}`, response.headers);
}
