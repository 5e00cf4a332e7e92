/**
 * The large-file section of `npm run bench`: one capture of about 1 GiB (the size the browser and
 * bench uploads must carry) through the bench API of a running app: multipart upload straight to
 * storage, then one worker streams it back and analyses it. The reference, measured in the same
 * run on the same file, is the engine reading it from local disk in one child process (the CLI's
 * single pass). Reports wall times, their ratio, and the peak RSS of the worker's job process.
 *
 *   set -a; source .data/env.bench; set +a
 *   node --import tsx scripts/bench/large-capture.ts --base-url http://127.0.0.1:3150 [--mib 1024]
 */
import { execFileSync } from "node:child_process";
import { createHash } from "node:crypto";
import { createReadStream, mkdirSync, openSync, readdirSync, readFileSync, readSync, closeSync } from "node:fs";
import path from "node:path";
import { parseArgs } from "node:util";
import { closeDb } from "@/db/queries/connection";
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

async function upload(token: string, file: string, size: number): Promise<string> {
  const plan = await benchApi<Plan>(BASE, "/api/v1/captures", token, {
    unitSerial: args.serial, testKind: "no-load", speedRpm: 1500, fileName: path.basename(file), sizeBytes: size, sha256: await sha256Of(file),
  });
  if (!plan.upload) throw new Error("this file is stored already: the bench resets its database first, so delete .data/bench and retry");
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

/** Resident set of a process and its descendants (the worker runs each job in a child), in MB. */
function treeRssMb(root: number): number {
  const children = new Map<number, number[]>();
  for (const entry of readdirSync("/proc")) {
    if (!/^\d+$/.test(entry)) continue;
    try {
      const ppid = Number(readFileSync(`/proc/${entry}/stat`, "utf8").split(") ")[1]?.split(" ")[1]);
      children.set(ppid, [...(children.get(ppid) ?? []), Number(entry)]);
    } catch { /* the process ended meanwhile */ }
  }
  let kb = 0;
  const stack = [root];
  while (stack.length > 0) {
    const pid = stack.pop() as number;
    try {
      kb += Number(/VmRSS:\s+(\d+)/.exec(readFileSync(`/proc/${pid}/status`, "utf8"))?.[1] ?? 0);
    } catch { /* gone */ }
    stack.push(...(children.get(pid) ?? []));
  }
  return kb / 1024;
}

async function main() {
  const live = await getAnalysisQueue().getWorkersCount();
  if (live > 0) throw new Error(`${live} worker(s) already serve this queue: stop them, or the figures mean nothing`);
  const { file, size } = benchFile();
  const reference = JSON.parse(execFileSync(process.execPath, ["--import", "tsx", "scripts/bench/measure-capture.ts", file, "never"], { encoding: "utf8", maxBuffer: 1 << 20 }).trim().split("\n").pop() ?? "{}") as { totalS: number; peakRssMb: number };
  const { token, keyId, labId } = await createBenchKey("large-capture benchmark");
  const started = Date.now();
  const id = await upload(token, file, size);
  const uploadS = (Date.now() - started) / 1000;
  const worker = await startBenchWorker();
  let peakMb = 0;
  const sampler = setInterval(() => (peakMb = Math.max(peakMb, treeRssMb(worker.pid ?? 0))), 250);
  let times = await listBenchCaptureTimes({ kind: "lab", labId }, [id]);
  while (times[0] && !["analysed", "rejected", "failed"].includes(times[0].state)) {
    await new Promise((r) => setTimeout(r, 500));
    times = await listBenchCaptureTimes({ kind: "lab", labId }, [id]);
  }
  clearInterval(sampler);
  await stopBenchWorker(worker);
  await revokeStationKey({ kind: "lab", labId }, keyId);
  const t = times[0];
  if (t?.state !== "analysed" || !t.uploadedAt || !t.analysedAt) throw new Error(`the capture ended ${t?.state ?? "missing"}`);
  // From upload complete, including the worker's start-up (it was started after the upload).
  const analysisS = (t.analysedAt.getTime() - t.uploadedAt.getTime()) / 1000;
  printTable(`One large capture through the bench API and a worker (reference: the engine on the same file from local disk, same run)`, [
    ["size (MiB)", "upload wall (s)", "complete → analysed (s)", "reference (s)", "ratio", "worker peak RSS (MB)", "reference RSS (MB)"],
    [(size / 1024 ** 2).toFixed(0), uploadS.toFixed(1), analysisS.toFixed(1), reference.totalS.toFixed(1), `${(analysisS / reference.totalS).toFixed(2)}×`, peakMb.toFixed(0), reference.peakRssMb.toFixed(0)],
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
