/**
 * Pipeline benchmark: N captures of R rows pushed through the bench API of a running app, analysed
 * by 1 and then 2 worker processes started here, in two modes:
 *  - live: workers run while the captures are uploaded: captures per minute from the first upload
 *    completed to the last analysed, and p50/p95 from "upload complete" (the row turning queued) to
 *    "analysed", both stamped by the server;
 *  - backlog: all captures are uploaded first, then the workers start: the drain rate is what the
 *    workers alone sustain (the live rate is capped by the upload rate once workers keep up).
 *
 *   set -a; source .data/env.test; set +a
 *   node --import tsx scripts/bench-pipeline.ts --base-url http://127.0.0.1:3100 [--captures 200] [--rows 100000] [--workers 1,2]
 *
 * The app at --base-url must run on the same env (database, bucket, queue prefix). Other workers on
 * the queue would skew the figures: stop them first (the script refuses to start otherwise).
 */
import { createHash } from "node:crypto";
import { parseArgs } from "node:util";
import { closeDb } from "@/db/queries/connection";
import { listBenchCaptureTimes } from "@/db/queries/captures";
import { revokeStationKey } from "@/db/queries/station-keys";
import { closeAnalysisQueue, getAnalysisQueue } from "@/lib/server/queue";
import { makeThreePhaseCsv } from "@/tests/fixtures/pipeline/make-capture";
import { benchApi, createBenchKey, startBenchWorker, stopAllBenchWorkers, stopBenchWorker } from "./bench/bench-client";
import { printTable } from "./bench/table";

const { values: args } = parseArgs({
  options: {
    "base-url": { type: "string", default: "http://127.0.0.1:3100" },
    captures: { type: "string", default: "200" },
    rows: { type: "string", default: "100000" },
    workers: { type: "string", default: "1,2" },
    serial: { type: "string", default: "KG45-260301" },
  },
});
const BASE = (args["base-url"] ?? "").replace(/\/$/, "");
const COUNT = Number(args.captures);
const ROWS = Number(args.rows);
const UPLOAD_LANES = 4;

type Plan = { capture: { id: string }; upload: { kind: "single"; url: string; headers: Record<string, string> } | { kind: "multipart" } | null };

async function uploadOne(token: string, csv: string, name: string): Promise<string> {
  const sha256 = createHash("sha256").update(csv).digest("hex");
  const plan = await benchApi<Plan>(BASE, "/api/v1/captures", token, { unitSerial: args.serial, testKind: "no-load", speedRpm: 1500, fileName: name, sizeBytes: Buffer.byteLength(csv), sha256 });
  if (plan.upload?.kind !== "single") throw new Error("the benchmark sends files below the multipart threshold only");
  const put = await fetch(plan.upload.url, { method: "PUT", headers: plan.upload.headers, body: csv });
  if (!put.ok) throw new Error(`PUT ${put.status}`);
  await benchApi(BASE, `/api/v1/captures/${plan.capture.id}/complete`, token, {});
  return plan.capture.id;
}

const quantile = (sorted: number[], q: number) => sorted[Math.min(sorted.length - 1, Math.floor(q * (sorted.length - 1)))] ?? NaN;

async function runOnce(workers: number, mode: "live" | "backlog", token: string, labId: string, template: string, run: string) {
  let procs = mode === "live" ? await Promise.all(Array.from({ length: workers }, startBenchWorker)) : [];
  const ids: string[] = [];
  let next = 0;
  const started = Date.now();
  await Promise.all(Array.from({ length: UPLOAD_LANES }, async () => {
    for (let n = next++; n < COUNT; n = next++) {
      const tag = `${run}-${mode}-${workers}w-${n}`;
      ids.push(await uploadOne(token, template.replace("# Record,0\n", `# Record,${tag}\n`), `bench-${tag}.csv`));
    }
  }));
  const uploadS = (Date.now() - started) / 1000;
  const drainFrom = Date.now();
  if (mode === "backlog") procs = await Promise.all(Array.from({ length: workers }, startBenchWorker));
  let times = await listBenchCaptureTimes({ kind: "lab", labId }, ids);
  while (times.some((t) => t.state !== "analysed" && t.state !== "rejected" && t.state !== "failed")) {
    await new Promise((r) => setTimeout(r, 500));
    times = await listBenchCaptureTimes({ kind: "lab", labId }, ids);
  }
  await Promise.all(procs.map(stopBenchWorker));
  const done = times.filter((t) => t.state === "analysed" && t.uploadedAt && t.analysedAt);
  const latency = done.map((t) => ((t.analysedAt as Date).getTime() - (t.uploadedAt as Date).getTime()) / 1000).sort((a, b) => a - b);
  const first = mode === "live" ? Math.min(...done.map((t) => (t.uploadedAt as Date).getTime())) : drainFrom;
  const last = Math.max(...done.map((t) => (t.analysedAt as Date).getTime()));
  return { mode, workers, analysed: done.length, notAnalysed: times.length - done.length, uploadS, perMinute: (done.length / ((last - first) / 1000)) * 60, p50: quantile(latency, 0.5), p95: quantile(latency, 0.95) };
}

async function main() {
  const live = await getAnalysisQueue().getWorkersCount();
  if (live > 0) throw new Error(`${live} worker(s) already serve this queue: stop them, or the figures mean nothing`);
  const { token, keyId, labId } = await createBenchKey("pipeline benchmark");
  const template = makeThreePhaseCsv({ sampleRateHz: 10_000, cycles: ROWS / 200 });
  const run = Date.now().toString(36);
  console.log(`${COUNT} captures × ${ROWS.toLocaleString("en")} rows (${(template.length / 1024 ** 2).toFixed(1)} MiB each) through ${BASE}`);
  const results = [];
  for (const mode of ["live", "backlog"] as const) {
    for (const workers of (args.workers ?? "1").split(",").map(Number)) {
      results.push(await runOnce(workers, mode, token, labId, template, run));
      console.log(`  ${mode}, ${workers} worker(s) done`);
    }
  }
  await revokeStationKey({ kind: "lab", labId }, keyId);
  printTable("Capture pipeline (latency: upload complete → analysed, server timestamps; backlog latency includes the wait)", [
    ["mode", "workers", "analysed", "not analysed", "upload wall (s)", "captures/min", "p50 (s)", "p95 (s)"],
    ...results.map((r) => [r.mode, String(r.workers), String(r.analysed), String(r.notAnalysed), r.uploadS.toFixed(1), r.perMinute.toFixed(1), r.p50.toFixed(2), r.p95.toFixed(2)]),
  ]);
}

try {
  await main();
} catch (err) {
  console.error(`bench-pipeline: ${err instanceof Error ? err.message : String(err)}`);
  process.exitCode = 1;
} finally {
  await stopAllBenchWorkers();
  await closeAnalysisQueue();
  await closeDb();
}
