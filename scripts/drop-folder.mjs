#!/usr/bin/env node
// Emfolio drop folder: watches a folder on the bench PC and sends each capture that has stopped
// growing through the bench API. Plain Node 20, no build step: `node scripts/drop-folder.mjs --help`.
import path from "node:path";
import { setTimeout as sleep } from "node:timers/promises";
import { RefusedError, sidecarOf } from "./drop-folder/capture-meta.mjs";
import { createSettleWatch, moveAside, REFUSED_DIR, SENT_DIR, sha256File } from "./drop-folder/folder.mjs";
import { HttpStatusError, TransientError } from "./drop-folder/http.mjs";
import { HELP, parseOptions, readStationKey, UsageError } from "./drop-folder/options.mjs";
import { sendCapture } from "./drop-folder/send-capture.mjs";
import { createLog, loadState, saveState } from "./drop-folder/state.mjs";

const BACKOFF_MS = [1000, 2000, 5000, 10_000, 30_000, 60_000];

function settle(ctx, file, sha256, kind, detail) {
  const base = path.basename(file);
  const sidecar = sidecarOf(file);
  if (kind === "sent") {
    ctx.state.sent[sha256] = { file: base, captureId: detail.captureId, at: new Date().toISOString() };
    delete ctx.state.pending[sha256];
    saveState(ctx.stateFile, ctx.state);
    moveAside(ctx.folder, file, SENT_DIR, { sidecar, tag: sha256.slice(0, 8) });
    ctx.log("sent", `${base}: capture ${detail.captureId} ${detail.duplicate ? "(already stored)" : detail.state}`);
  } else {
    delete ctx.state.pending[sha256];
    saveState(ctx.stateFile, ctx.state);
    moveAside(ctx.folder, file, REFUSED_DIR, { sidecar, reason: detail, tag: sha256.slice(0, 8) });
    ctx.log("refused", `${base}: ${detail}`);
  }
}

/** One attempt at one file; returns true when it is settled (sent or refused). */
async function attempt(ctx, file, failures) {
  const sha256 = await sha256File(file);
  const earlier = ctx.state.sent[sha256];
  if (earlier) {
    settle(ctx, file, sha256, "sent", { captureId: earlier.captureId, duplicate: true });
    return true;
  }
  try {
    settle(ctx, file, sha256, "sent", await sendCapture(ctx, file, sha256));
    return true;
  } catch (error) {
    if (error instanceof RefusedError) {
      settle(ctx, file, sha256, "refused", error.message);
      return true;
    }
    if (error instanceof HttpStatusError) throw new UsageError(`The server refused the station key (${error.status}): ${error.message}`);
    if (!(error instanceof TransientError)) throw error;
    const count = (failures.get(file) ?? 0) + 1;
    failures.set(file, count);
    const wait = error.retryAfterMs ?? BACKOFF_MS[Math.min(count - 1, BACKOFF_MS.length - 1)];
    ctx.log("retry", `${path.basename(file)}: ${error.message}; attempt ${count}, next in ${Math.round(wait / 1000)} s`);
    ctx.nextTry.set(file, Date.now() + wait);
    return false;
  }
}

async function run(ctx) {
  const watch = createSettleWatch(ctx.folder, ctx.settleMs, new Set([ctx.logFile, ctx.stateFile]));
  const failures = new Map();
  const givenUp = new Set();
  for (;;) {
    const look = watch();
    const ready = look.ready.filter((file) => !givenUp.has(file));
    let busy = false;
    for (const file of ready) {
      if ((ctx.nextTry.get(file) ?? 0) > Date.now()) {
        busy = true;
        continue;
      }
      const settled = await attempt(ctx, file, failures);
      if (!settled) busy = true;
      if (!settled && ctx.once && (failures.get(file) ?? 0) >= ctx.maxAttempts) {
        givenUp.add(file);
        ctx.log("error", `${path.basename(file)}: left in the folder after ${ctx.maxAttempts} failed attempts`);
      }
    }
    // --once: done when nothing is settling or waiting for a retry (every file sent, refused or given up).
    if (ctx.once && !busy && look.settling === 0 && ready.length === 0) return givenUp.size === 0 ? 0 : 1;
    await sleep(ctx.pollMs);
  }
}

async function main(argv) {
  let options;
  try {
    options = parseOptions(argv);
    if (options.help) {
      process.stdout.write(`${HELP}\n`);
      return 0;
    }
    // The one place this program reads its environment: the station key, when no key file is given.
    const key = readStationKey(options, process.env);
    const log = createLog(options.logFile);
    const ctx = { ...options, key, log, state: loadState(options.stateFile), nextTry: new Map(), progress: true };
    log("info", `watching ${options.folder} for ${options.server} (${options.once ? "once" : "until stopped"})`);
    return await run(ctx);
  } catch (error) {
    if (error instanceof UsageError) {
      process.stderr.write(`drop-folder: ${error.message}\n`);
      return 2;
    }
    process.stderr.write(`drop-folder: internal error: ${error instanceof Error ? error.stack : String(error)}\n`);
    return 1;
  }
}

process.exitCode = await main(process.argv.slice(2));
