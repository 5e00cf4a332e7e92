// Sends one settled capture: register, upload (single PUT or the parts of a multipart plan), complete.
// Uploads in progress are kept in the state file, so an interrupted multipart upload resumes. Every
// upload URL is bound to its bytes: a part's URL is asked for with the part's sha256 and carries it.
// A store or server that is away or busy (network errors, 429, 5xx) is tried again a few times in
// place, honouring Retry-After; after that the file waits for the next attempt of the main loop.
import { statSync } from "node:fs";
import path from "node:path";
import { captureMeta, RefusedError } from "./capture-meta.mjs";
import { HttpStatusError, TransientError, callApi, putRange, sha256Range, withRetries } from "./http.mjs";
import { saveState } from "./state.mjs";

/** Start over from registration (the upload the server knew is gone or cannot be assembled). */
class RestartError extends Error {}

const mib = (bytes) => `${(bytes / 1024 ** 2).toFixed(1)} MiB`;

function progress(ctx, name, done, total) {
  if (!ctx.progress) return;
  const line = `${name}: ${Math.floor((100 * done) / total)} % (${mib(done)} of ${mib(total)})`;
  if (process.stdout.isTTY) process.stdout.write(`\r${line}   `);
  else if (done === total) process.stdout.write(`${line}\n`);
}

async function register(ctx, file, sha256, meta) {
  const { sidecar: _sidecar, ...fields } = meta;
  const body = { ...fields, fileName: path.basename(file), sizeBytes: statSync(file).size, sha256 };
  try {
    return (await callApi(ctx.server, ctx.key, "POST", "/api/v1/captures", body)).json;
  } catch (error) {
    if (error instanceof HttpStatusError && error.status !== 401 && error.status !== 403) throw new RefusedError(`registration refused (${error.status}): ${error.message}`);
    throw error;
  }
}

function retrying(ctx, what, attempt) {
  return withRetries(what, attempt, (wait, error, tryNumber) => ctx.log("retry", `${what}: ${error.message}; try ${tryNumber + 1} in ${Math.round(wait / 100) / 10} s`));
}

/** A URL for one part, bound to its sha256 (and, by the server, to its length). */
async function partUrl(ctx, entry, partNumber, sha256) {
  try {
    const answer = await callApi(ctx.server, ctx.key, "POST", `/api/v1/captures/${entry.captureId}/parts`, { parts: [{ partNumber, sha256 }] });
    const issued = answer.json?.parts?.[0];
    if (!issued?.url) throw new RestartError(`no URL was issued for part ${partNumber}`);
    return issued;
  } catch (error) {
    if (error instanceof HttpStatusError && error.status !== 401 && error.status !== 403) throw new RestartError(error.message);
    throw error;
  }
}

async function uploadParts(ctx, file, entry) {
  const size = statSync(file).size;
  const base = path.basename(file);
  entry.sha256s ??= {};
  let done = Object.keys(entry.etags).reduce((sum, n) => sum + Math.min(entry.partSize, size - (Number(n) - 1) * entry.partSize), 0);
  for (let partNumber = 1; partNumber <= entry.partCount; partNumber++) {
    if (entry.etags[partNumber]) continue;
    const start = (partNumber - 1) * entry.partSize;
    const end = Math.min(size, start + entry.partSize);
    const sha256 = await sha256Range(file, start, end);
    const etag = await retrying(ctx, `${base}, part ${partNumber}`, async () => {
      // A fresh URL for every try: one issued before the store went away may have expired since.
      const issued = await partUrl(ctx, entry, partNumber, sha256);
      let sent = 0;
      try {
        return await putRange(issued.url, file, start, end, issued.headers ?? {}, (n) => progress(ctx, base, done + (sent += n), size), ctx.limitBytesPerS);
      } catch (error) {
        if (error instanceof HttpStatusError) throw new RestartError(error.message);
        throw error;
      }
    });
    entry.etags[partNumber] = etag;
    entry.sha256s[partNumber] = sha256;
    done += end - start;
    saveState(ctx.stateFile, ctx.state);
  }
}

async function uploadSingle(ctx, file, plan) {
  const size = statSync(file).size;
  await retrying(ctx, path.basename(file), async () => {
    let sent = 0;
    try {
      await putRange(plan.url, file, 0, size, plan.headers ?? {}, (n) => progress(ctx, path.basename(file), (sent += n), size), ctx.limitBytesPerS);
    } catch (error) {
      // 412: the URL is bound to this file's sha256 and the key holds an object: this file, from a try whose answer was lost.
      if (error instanceof HttpStatusError && error.status === 412) return;
      if (error instanceof HttpStatusError) throw new RestartError(error.message);
      throw error;
    }
  });
}

async function complete(ctx, entry) {
  const parts = entry.kind === "multipart"
    ? Object.entries(entry.etags).map(([n, etag]) => ({ partNumber: Number(n), etag, ...(entry.sha256s?.[n] ? { sha256: entry.sha256s[n] } : {}) })).sort((a, b) => a.partNumber - b.partNumber)
    : undefined;
  try {
    return (await callApi(ctx.server, ctx.key, "POST", `/api/v1/captures/${entry.captureId}/complete`, parts ? { parts } : {})).json;
  } catch (error) {
    if (!(error instanceof HttpStatusError)) throw error;
    if (error.status === 415 || error.status === 422) throw new RefusedError(`refused by the server: ${error.message}`);
    if (error.status === 401 || error.status === 403) throw error;
    throw new RestartError(error.message);
  }
}

/**
 * One attempt at sending a capture. Returns { captureId, state, duplicate }; throws RefusedError
 * (move it aside), TransientError (try again later) or HttpStatusError 401/403 (the key).
 */
export async function sendCapture(ctx, file, sha256) {
  const meta = captureMeta(file, ctx.pattern, ctx.testKind);
  for (let restarts = 0; ; restarts++) {
    let entry = ctx.state.pending[sha256];
    try {
      if (entry?.kind === "multipart") {
        ctx.log("info", `${path.basename(file)}: resuming upload of capture ${entry.captureId} (${Object.keys(entry.etags).length} of ${entry.partCount} parts stored)`);
      } else {
        const answer = await register(ctx, file, sha256, meta);
        const plan = answer.upload;
        if (!plan) return { captureId: answer.capture.id, state: answer.capture.state, duplicate: true };
        entry = { captureId: answer.capture.id, file: path.basename(file), kind: plan.kind, etags: {} };
        if (plan.kind === "multipart") Object.assign(entry, { partSize: plan.partSize, partCount: plan.partCount, sha256s: {} });
        ctx.state.pending[sha256] = entry;
        saveState(ctx.stateFile, ctx.state);
        if (plan.kind === "single") await uploadSingle(ctx, file, plan);
      }
      if (entry.kind === "multipart") await uploadParts(ctx, file, entry);
      const done = await complete(ctx, entry);
      return { captureId: entry.captureId, state: done?.state ?? "queued", duplicate: false };
    } catch (error) {
      if (!(error instanceof RestartError)) throw error;
      delete ctx.state.pending[sha256];
      saveState(ctx.stateFile, ctx.state);
      if (restarts >= 2) throw new TransientError(`upload failed three times from the start: ${error.message}`);
      ctx.log("retry", `${path.basename(file)}: ${error.message}; starting the upload again`);
    }
  }
}
