/**
 * The large-file section of `npm run bench`: one capture of about 1 GiB (the size the browser and
 * bench uploads must carry) through the bench API of a running app: multipart upload straight to
 * storage, then one worker (already running, warmed by a small capture) reads it back with parallel
 * ranged GETs into the two-thread ingestion and analyses it. The reference, measured in the same
 * run on the same file, is the engine reading it from local disk in one child process, as the
 * command-line tool does (two threads). Reports completion → analysed against the reference (target
 * ≤ 1.25×) and the worker's peak RSS (the worker and its job process) against the reference's
 * (target ≤ 1.2×).
 *
 *   set -a; source .data/env.bench; set +a
 *   node --import tsx scripts/bench/large-capture.ts --base-url http://127.0.0.1:3150 [--mib 1024]
 */
import { execFileSync } from "node:child_process";
import { createHash } from "node:crypto";
import { createReadStream, mkdirSync, openSync, readdirSync, readFileSync, readSync, closeSync, statSync } from "node:fs";
import { availableParallelism, loadavg } from "node:os";
import path from "node:path";
import { parseArgs } from "node:util";
import { closeDb } from "@/db/queries/connection";
import { getEnv } from "@/lib/server/env";
import { listBenchCaptureTimes } from "@/db/queries/captures";
import { revokeStationKey } from "@/db/queries/station-keys";
import { closeAnalysisQueue, getAnalysisQueue } from "@/lib/server/queue";
import { benchApi, createBenchKey, startBenchWorker, stopAllBenchWorkers, stopBenchWorker } from "./bench-client";
import { ensureBenchCapture } from "./generate";
import { printTable } from "./table";

const { values: args } = parseArgs({
  options: { "base-url": { type: "string", default: "http://127.0.0.1:3150" }, mib: { type: "string", default: "1024" }, serial: { type: "string", default: "KG45-260301" } },
});
const BASE = (args["base-url"] ?? "").replace(/\/$/, "");
const TARGET_BYTES = Number(args.mib) * 1024 ** 2;
const OUT = path.join(".data", "bench");
const LANES = 4;
const TARGET_TIME_RATIO = 1.25;
const TARGET_RSS_RATIO = 1.2;

type Plan = { capture: { id: string }; upload: { kind: "multipart"; partSize: number; partCount: number } | { kind: "single"; url: string; headers: Record<string, string> } | null };
type PartUrls = { parts: { partNumber: number; url: string; headers: Record<string, string> }[] };

function benchFile(): { file: string; size: number } {
  mkdirSync(OUT, { recursive: true });
  const sample = path.join(OUT, "capture-row-sample.csv");
  const sampleRows = 20_000;
  const bytesPerRow = ensureBenchCapture(sample, sampleRows) / sampleRows;
  const rows = Math.ceil((TARGET_BYTES / bytesPerRow) * 1.005);
  const file = path.join(OUT, `capture-${args.mib}MiB.csv`);
  return { file, size: ensureBenchCapture(file, rows) };
}

async function sha256Of(file: string): Promise<string> {
  const hash = createHash("sha256");
  for await (const chunk of createReadStream(file, { highWaterMark: 4 << 20 })) hash.update(chunk as Buffer);
  return hash.digest("hex");
}

function readSlice(file: string, start: number, length: number): Uint8Array<ArrayBuffer> {
  const buffer = new Uint8Array(length);
  const fd = openSync(file, "r");
  try {
    let done = 0;
    while (done < length) done += readSync(fd, buffer, done, length - done, start + done);
  } finally {
    closeSync(fd);
  }
  return buffer;
}

async function upload(token: string, file: string, size: number): Promise<string | null> {
  const plan = await benchApi<Plan>(BASE, "/api/v1/captures", token, {
    unitSerial: args.serial, testKind: "no-load", speedRpm: 1500, fileName: path.basename(file), sizeBytes: size, sha256: await sha256Of(file),
  });
  if (!plan.upload) return null;
  if (plan.upload.kind === "single") {
    // Below the multipart threshold (a quick run with a small --mib): one PUT.
    const res = await fetch(plan.upload.url, { method: "PUT", headers: plan.upload.headers, body: readSlice(file, 0, size) });
    if (!res.ok) throw new Error(`PUT: ${res.status}`);
    await benchApi(BASE, `/api/v1/captures/${plan.capture.id}/complete`, token, {});
    return plan.capture.id;
  }
  const { partSize, partCount } = plan.upload;
  const etags: { partNumber: number; etag: string; sha256: string }[] = [];
  let next = 1;
  await Promise.all(Array.from({ length: LANES }, async () => {
    for (let partNumber = next++; partNumber <= partCount; partNumber = next++) {
      const start = (partNumber - 1) * partSize;
      const body = readSlice(file, start, Math.min(partSize, size - start));
      // Each part URL is bound to the part's sha256 (and length): ask for it once the part is hashed.
      const sha256 = createHash("sha256").update(body).digest("hex");
      const issued = (await benchApi<PartUrls>(BASE, `/api/v1/captures/${plan.capture.id}/parts`, token, { parts: [{ partNumber, sha256 }] })).parts[0];
      if (!issued) throw new Error(`no URL for part ${partNumber}`);
      const res = await fetch(issued.url, { method: "PUT", headers: issued.headers, body });
      if (!res.ok) throw new Error(`PUT part ${partNumber}: ${res.status}`);
      etags.push({ partNumber, etag: res.headers.get("etag") ?? "", sha256 });
    }
  }));
  await benchApi(BASE, `/api/v1/captures/${plan.capture.id}/complete`, token, { parts: etags.sort((a, b) => a.partNumber - b.partNumber) });
  return plan.capture.id;
}

/** ppid and CPU seconds (user + system, at 100 ticks a second) of one process; null once it is gone. */
function readStat(pid: number): { ppid: number; cpuS: number } | null {
  try {
    const fields = readFileSync(`/proc/${pid}/stat`, "utf8").split(") ")[1]?.split(" ") ?? [];
    return { ppid: Number(fields[1]), cpuS: (Number(fields[11]) + Number(fields[12])) / 100 };
  } catch {
    return null;
  }
}

const cpuSeconds = (pid: number): number | null => readStat(pid)?.cpuS ?? null;

/** Resident set of one process in MB (0 once it is gone). */
function rssMb(pid: number): number {
  try {
    return Number(/VmRSS:\s+(\d+)/.exec(readFileSync(`/proc/${pid}/status`, "utf8"))?.[1] ?? 0) / 1024;
  } catch {
    return 0;
  }
}

type TreeSample = { pid: number; cpuS: number; rssMb: number }[];

/**
 * One walk of /proc: each live process of the tree under `root` (the worker runs each job in a
 * child) with its CPU seconds and resident set, so one sample gives both figures.
 */
function sampleTree(root: number): TreeSample {
  const stats = new Map<number, { ppid: number; cpuS: number }>();
  const children = new Map<number, number[]>();
  for (const entry of readdirSync("/proc")) {
    if (!/^\d+$/.test(entry)) continue;
    const pid = Number(entry);
    const stat = readStat(pid);
    if (!stat) continue;
    stats.set(pid, stat);
    children.set(stat.ppid, [...(children.get(stat.ppid) ?? []), pid]);
  }
  const tree: TreeSample = [];
  const stack = [root];
  while (stack.length > 0) {
    const pid = stack.pop() as number;
    const stat = stats.get(pid);
    if (stat) tree.push({ pid, cpuS: stat.cpuS, rssMb: rssMb(pid) });
    stack.push(...(children.get(pid) ?? []));
  }
  return tree;
}

/** Peak resident set of the tree and of its largest process, and the CPU it used from the first sample on (processes that start later count from zero). */
function treeTracker(root: number) {
  const first = new Map<number, number>();
  const last = new Map<number, number>();
  let peakMb = 0;
  let peakLargestMb = 0;
  const record = (initial: boolean): void => {
    const tree = sampleTree(root);
    for (const { pid, cpuS } of tree) {
      if (!first.has(pid)) first.set(pid, initial ? cpuS : 0);
      last.set(pid, cpuS);
    }
    const each = tree.map((p) => p.rssMb);
    peakMb = Math.max(peakMb, each.reduce((a, b) => a + b, 0));
    peakLargestMb = Math.max(peakLargestMb, ...each);
  };
  record(true);
  return {
    sample: () => record(false),
    peakMb: () => peakMb,
    peakLargestMb: () => peakLargestMb,
    cpuUsed: () => [...last].reduce((sum, [pid, cpu]) => sum + cpu - (first.get(pid) ?? 0), 0),
  };
}

/** The process listening on the store's port (the local fake shares this machine's cores). */
function storePid(): number | null {
  const port = new URL(getEnv().S3_ENDPOINT).port;
  try {
    const out = execFileSync("ss", ["-ltnpH", `sport = :${port}`], { encoding: "utf8" });
    return Number(/pid=(\d+)/.exec(out)?.[1]) || null;
  } catch {
    return null;
  }
}

async function waitUntilDone(labId: string, id: string) {
  let times = await listBenchCaptureTimes({ kind: "lab", labId }, [id]);
  while (times[0] && !["analysed", "rejected", "failed"].includes(times[0].state)) {
    await new Promise((r) => setTimeout(r, 200));
    times = await listBenchCaptureTimes({ kind: "lab", labId }, [id]);
  }
  return times[0];
}

const verdict = (ratio: number, target: number) => `${ratio.toFixed(2)}× (${ratio <= target ? "met" : "missed"} ≤ ${target}×)`;

async function main() {
  const live = await getAnalysisQueue().getWorkersCount();
  if (live > 0) throw new Error(`${live} worker(s) already serve this queue: stop them, or the figures mean nothing`);
  const { file, size } = benchFile();
  const reference = JSON.parse(execFileSync(process.execPath, ["--import", "tsx", "scripts/bench/measure-capture.ts", file, "auto"], { encoding: "utf8", maxBuffer: 1 << 20 }).trim().split("\n").pop() ?? "{}") as { totalS: number; peakRssMb: number; ingestPath: string; cpuS: number };
  const { token, keyId, labId } = await createBenchKey("large-capture benchmark");
  const worker = await startBenchWorker();
  // A small capture first, so the job process is up and warm: the figure is the pipeline's, not a start-up's.
  const warm = await upload(token, path.join(OUT, "capture-row-sample.csv"), statSync(path.join(OUT, "capture-row-sample.csv")).size);
  if (warm) await waitUntilDone(labId, warm);
  const started = Date.now();
  const id = await upload(token, file, size);
  if (!id) throw new Error("this file is stored already: the bench resets its database first, so delete .data/bench and retry");
  const uploadS = (Date.now() - started) / 1000;
  const workerTree = treeTracker(worker.pid ?? 0);
  const store = storePid();
  const storeCpuBefore = store ? cpuSeconds(store) : null;
  const sampler = setInterval(workerTree.sample, 100);
  const t = await waitUntilDone(labId, id);
  clearInterval(sampler);
  workerTree.sample();
  const peakMb = workerTree.peakMb();
  const peakJobMb = workerTree.peakLargestMb();
  const workerCpuS = workerTree.cpuUsed();
  const storeCpu = store && storeCpuBefore !== null ? (cpuSeconds(store) ?? storeCpuBefore) - storeCpuBefore : null;
  await stopBenchWorker(worker);
  await revokeStationKey({ kind: "lab", labId }, keyId);
  if (t?.state !== "analysed" || !t.uploadedAt || !t.analysedAt) throw new Error(`the capture ended ${t?.state ?? "missing"}`);
  const analysisS = (t.analysedAt.getTime() - t.uploadedAt.getTime()) / 1000;
  printTable(`One large capture through the bench API and a warm worker (reference: the engine on the same file from local disk, ${reference.ingestPath} ingestion, same run)`, [
    ["size (MiB)", "upload wall (s)", "complete → analysed (s)", "reference (s)", "time ratio", "worker peak RSS (MB)", "of which job process", "reference RSS (MB)", "memory ratio"],
    [(size / 1024 ** 2).toFixed(0), uploadS.toFixed(1), analysisS.toFixed(1), reference.totalS.toFixed(1), verdict(analysisS / reference.totalS, TARGET_TIME_RATIO),
      peakMb.toFixed(0), peakJobMb.toFixed(0), reference.peakRssMb.toFixed(0), verdict(peakMb / reference.peakRssMb, TARGET_RSS_RATIO)],
  ]);
  // Where the time goes on a machine whose cores the store shares: CPU seconds, not wall time.
  const cores = availableParallelism();
  printTable(`CPU seconds for the same work (${cores} cores, load average ${loadavg()[0]?.toFixed(1)}): the engine alone, the worker (download, sha256, parse, analysis, storing), the local store serving the ranges`, [
    ["reference engine", "worker", "worker ÷ engine", "local store", "(worker + store) ÷ engine"],
    [reference.cpuS.toFixed(1), workerCpuS.toFixed(1), `${(workerCpuS / reference.cpuS).toFixed(2)}×`, storeCpu === null ? "n/a" : storeCpu.toFixed(1),
      storeCpu === null ? "n/a" : `${((workerCpuS + storeCpu) / reference.cpuS).toFixed(2)}×`],
  ]);
}

try {
  await main();
} catch (err) {
  console.error(`large-capture: ${err instanceof Error ? err.message : String(err)}`);
  process.exitCode = 1;
} finally {
  await stopAllBenchWorkers();
  await closeAnalysisQueue();
  await closeDb();
}
