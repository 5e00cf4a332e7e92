// Sends one settled capture: register, upload (single PUT or the parts of a multipart plan), complete.
// Uploads in progress are kept in the state file, so an interrupted multipart upload resumes.
import { statSync } from "node:fs";
import path from "node:path";
import { captureMeta, RefusedError } from "./capture-meta.mjs";
import { HttpStatusError, TransientError, callApi, putRange } from "./http.mjs";
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

async function uploadParts(ctx, file, entry, urls) {
  const size = statSync(file).size;
  let done = Object.keys(entry.etags).reduce((sum, n) => sum + Math.min(entry.partSize, size - (Number(n) - 1) * entry.partSize), 0);
  for (const { partNumber, url } of urls) {
    if (entry.etags[partNumber]) continue;
    const start = (partNumber - 1) * entry.partSize;
    const end = Math.min(size, start + entry.partSize);
    let sent = 0;
    try {
      entry.etags[partNumber] = await putRange(url, file, start, end, {}, (n) => progress(ctx, path.basename(file), done + (sent += n), size), ctx.limitBytesPerS);
    } catch (error) {
      if (error instanceof HttpStatusError) throw new RestartError(error.message);
      throw error;
    }
    done += end - start;
    saveState(ctx.stateFile, ctx.state);
  }
}

async function uploadSingle(ctx, file, plan) {
  const size = statSync(file).size;
  let sent = 0;
  try {
    await putRange(plan.url, file, 0, size, plan.headers ?? {}, (n) => progress(ctx, path.basename(file), (sent += n), size), ctx.limitBytesPerS);
  } catch (error) {
    if (error instanceof HttpStatusError) throw new RestartError(error.message);
    throw error;
  }
}

async function complete(ctx, entry) {
  const parts = entry.kind === "multipart" ? Object.entries(entry.etags).map(([n, etag]) => ({ partNumber: Number(n), etag })).sort((a, b) => a.partNumber - b.partNumber) : undefined;
  try {
    return (await callApi(ctx.server, ctx.key, "POST", `/api/v1/captures/${entry.captureId}/complete`, parts ? { parts } : {})).json;
  } catch (error) {
    if (!(error instanceof HttpStatusError)) throw error;
    if (error.status === 415 || error.status === 422) throw new RefusedError(`refused by the server: ${error.message}`);
    if (error.status === 401 || error.status === 403) throw error;
    throw new RestartError(error.message);
  }
}

/** Missing parts of a multipart upload already registered: fresh URLs from the server. */
async function resumeUrls(ctx, entry) {
  const missing = Array.from({ length: entry.partCount }, (_, i) => i + 1).filter((n) => !entry.etags[n]);
  if (missing.length === 0) return [];
  const urls = [];
  for (let i = 0; i < missing.length; i += 200) {
    try {
      const answer = await callApi(ctx.server, ctx.key, "POST", `/api/v1/captures/${entry.captureId}/parts`, { partNumbers: missing.slice(i, i + 200) });
      urls.push(...answer.json.parts);
    } catch (error) {
      if (error instanceof HttpStatusError && error.status !== 401 && error.status !== 403) throw new RestartError(error.message);
      throw error;
    }
  }
  return urls;
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
      let urls = null;
      if (entry?.kind === "multipart") {
        ctx.log("info", `${path.basename(file)}: resuming upload of capture ${entry.captureId} (${Object.keys(entry.etags).length} of ${entry.partCount} parts stored)`);
        urls = await resumeUrls(ctx, entry);
      } else {
        const answer = await register(ctx, file, sha256, meta);
        const plan = answer.upload;
        if (!plan) return { captureId: answer.capture.id, state: answer.capture.state, duplicate: true };
        entry = { captureId: answer.capture.id, file: path.basename(file), kind: plan.kind, etags: {} };
        if (plan.kind === "multipart") Object.assign(entry, { partSize: plan.partSize, partCount: plan.parts.length });
        ctx.state.pending[sha256] = entry;
        saveState(ctx.stateFile, ctx.state);
        if (plan.kind === "single") await uploadSingle(ctx, file, plan);
        else urls = plan.parts;
      }
      if (urls) await uploadParts(ctx, file, entry, urls);
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
