/**
 * The hosts run's driver (scripts/hosts/run.sh makes the namespaces or users, starts the services on
 * the bridge address and sets the env): this process plays the web instance on the services' host,
 * registering and uploading captures through the bench API's route handlers and the store, while
 * the queue is paused; then W worker processes start on other simulated hosts
 * (scripts/hosts/start-worker.sh), the queue resumes, and the backlog drains. Prints a table:
 * workers, captures, analysed, failed, drain time, captures per minute. Every loop is bounded.
 *   tsx --import ./scripts/support/server-only-hook.mjs scripts/hosts/drive.ts --mode netns --tag T --run-dir D --captures 40 --workers 1,2,4 [--short]
 */
import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import { createHash } from "node:crypto";
import { createWriteStream, rmSync, writeFileSync } from "node:fs";
import { parseArgs } from "node:util";
import { closeDb } from "@/db/queries/connection";
import { listBenchCaptureTimes } from "@/db/queries/captures";
import { POST as registerRoute } from "@/app/api/v1/captures/route";
import { POST as completeRoute } from "@/app/api/v1/captures/[id]/complete/route";
import { closeAnalysisQueue, getAnalysisQueue } from "@/lib/server/queue";
import { getEnv } from "@/lib/server/env";
import { makeThreePhaseCsv } from "@/tests/fixtures/pipeline/make-capture";
import { createBenchKey } from "../bench/bench-client";
import { printTable } from "../bench/table";

const { values: args } = parseArgs({
  options: {
    mode: { type: "string", default: "netns" },
    captures: { type: "string", default: "40" },
    workers: { type: "string", default: "1,2,4" },
    rows: { type: "string", default: "50000" },
    short: { type: "boolean", default: false },
    tag: { type: "string", default: "" },
    "run-dir": { type: "string", default: "" },
  },
});
/** Names of the namespaces and users (run.sh's TAG) and the folder of pid, log and env files. */
const settings = { tag: args.tag ?? "", runDir: args["run-dir"] ?? "" };
if (!settings.tag || !settings.runDir) throw new Error("--tag and --run-dir come from scripts/hosts/run.sh");
const COUNT = Number(args.captures);
const ROWS = Number(args.rows);
const ROUNDS = (args.workers ?? "1").split(",").map(Number);
const UPLOAD_LANES = 4;
/** A round that has not drained this long after the queue resumed ends as it is (counted as not analysed). */
const DRAIN_LIMIT_MS = Math.max(60_000, COUNT * 20_000);
const READY_LIMIT_MS = 90_000;
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
const log = (line: string) => console.log(`${new Date().toISOString().slice(11, 19)} ${line}`);
const json = (token: string, body: unknown) => ({ method: "POST", headers: { Authorization: `Bearer ${token}`, "Content-Type": "application/json" }, body: JSON.stringify(body) });

async function send(token: string, csv: string, name: string): Promise<string> {
  const sha256 = createHash("sha256").update(csv).digest("hex");
  const reg = await registerRoute(new Request("http://hosts/api/v1/captures",
    json(token, { unitSerial: "KG45-260301", testKind: "no-load", speedRpm: 1500, fileName: name, sizeBytes: Buffer.byteLength(csv), sha256 })));
  const plan = (await reg.json()) as { capture?: { id: string }; upload?: { kind: string; url: string; headers: Record<string, string> } | null; error?: string };
  if (!reg.ok || !plan.capture) throw new Error(`register ${reg.status}: ${plan.error ?? ""}`);
  if (plan.upload?.kind !== "single") throw new Error("the hosts run sends files below the multipart threshold only");
  const put = await fetch(plan.upload.url, { method: "PUT", headers: plan.upload.headers, body: csv });
  if (!put.ok) throw new Error(`PUT ${put.status}`);
  const id = plan.capture.id;
  const done = await completeRoute(new Request(`http://hosts/api/v1/captures/${id}/complete`, json(token, {})), { params: Promise.resolve({ id }) });
  if (done.status !== 202) throw new Error(`complete ${done.status}`);
  return id;
}

async function uploadBacklog(token: string, round: number): Promise<string[]> {
  const ids: string[] = [];
  let next = 0;
  await Promise.all(Array.from({ length: UPLOAD_LANES }, async () => {
    for (let i = next++; i < COUNT; i = next++) {
      const csv = makeThreePhaseCsv({ variant: Date.now() % 1_000_000 + round * 10_000 + i, cycles: Math.round((ROWS * 50) / 10_000) });
      ids.push(await send(token, csv, `hosts-${round}-${i}.csv`));
    }
  }));
  return ids;
}

type Worker = { index: number; proc: ChildProcess; ready: Promise<void> };

function startWorker(index: number): Worker {
  const proc = spawn("bash", ["scripts/hosts/start-worker.sh", String(index)], { stdio: ["ignore", "pipe", "pipe"], detached: true });
  if (proc.pid) writeFileSync(`${settings.runDir}/worker-${index}.pid`, String(proc.pid));
  const logFile = createWriteStream(`${settings.runDir}/worker-${index}.log`, { flags: "a" });
  proc.stderr?.pipe(logFile);
  const ready = new Promise<void>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`worker ${index} not ready within ${READY_LIMIT_MS / 1000} s (log: ${settings.runDir}/worker-${index}.log)`)), READY_LIMIT_MS);
    proc.stdout?.on("data", (d: Buffer) => {
      logFile.write(d);
      if (d.toString().includes("ready:")) { clearTimeout(timer); resolve(); }
    });
    proc.once("exit", (code) => { clearTimeout(timer); reject(new Error(`worker ${index} exited (${code}) before it was ready (log: ${settings.runDir}/worker-${index}.log)`)); });
  });
  ready.catch(() => undefined);
  return { index, proc, ready };
}

async function stopWorker(w: Worker): Promise<void> {
  const pid = w.proc.pid;
  if (pid && w.proc.exitCode === null) {
    const exited = new Promise((r) => w.proc.once("exit", r));
    try { process.kill(-pid, "SIGTERM"); } catch { /* gone */ }
    const timer = setTimeout(() => { try { process.kill(-pid, "SIGKILL"); } catch { /* gone */ } }, 20_000);
    await exited;
    clearTimeout(timer);
  }
  rmSync(`${settings.runDir}/worker-${w.index}.pid`, { force: true });
}

/** Which network namespace a worker process is in ("" for the host's own), by `ip netns identify`. */
function namespaceOf(pid: number): string {
  return spawnSync("ip", ["netns", "identify", String(pid)], { encoding: "utf8" }).stdout.trim();
}

/** The namespace's 127.0.0.1 is its own: the services are not there, only at the bridge address. */
function loopbackIsolated(index: number): boolean {
  const probe = spawnSync("ip", ["netns", "exec", `${settings.tag}-h${index}`, "bash", "-c", `exec 3<>/dev/tcp/127.0.0.1/${new URL(getEnv().DATABASE_URL).port}`], { encoding: "utf8", timeout: 5_000 });
  return probe.status !== 0;
}

async function runRound(token: string, labId: string, workers: number, round: number): Promise<string[]> {
  const queue = getAnalysisQueue();
  await queue.pause();
  log(`round ${round}: uploading ${COUNT} captures of ${ROWS} rows while the queue is paused`);
  const ids = await uploadBacklog(token, round);
  log(`round ${round}: starting ${workers} worker process(es) on other hosts (${args.mode})`);
  const started = Array.from({ length: workers }, (_, i) => startWorker(i + 1));
  const where: string[] = [];
  try {
    await Promise.all(started.map((w) => w.ready));
    for (const w of started) {
      // The worker is the child of `ip netns exec` / `runuser`, which exec it: the group leader's pid.
      const pid = w.proc.pid ?? 0;
      where.push(args.mode === "netns" ? `${namespaceOf(pid) || "host"}${loopbackIsolated(w.index) ? "" : " (loopback NOT isolated)"}` : `user ${settings.tag}w${w.index}`);
    }
    const t0 = Date.now();
    await queue.resume();
    let rows: Awaited<ReturnType<typeof listBenchCaptureTimes>> = [];
    for (const until = t0 + DRAIN_LIMIT_MS; Date.now() < until;) {
      rows = await listBenchCaptureTimes({ kind: "lab", labId }, ids);
      if (rows.length === ids.length && rows.every((r) => ["analysed", "failed", "rejected"].includes(r.state))) break;
      await sleep(250);
    }
    const analysed = rows.filter((r) => r.state === "analysed");
    const failed = rows.filter((r) => r.state === "failed" || r.state === "rejected").length;
    const last = Math.max(t0, ...analysed.map((r) => r.analysedAt?.getTime() ?? 0));
    const minutes = (last - t0) / 60_000;
    const perMin = analysed.length > 0 && minutes > 0 ? analysed.length / minutes : 0;
    return [String(workers), String(ids.length), String(analysed.length), String(failed), String(ids.length - analysed.length - failed),
      `${((last - t0) / 1000).toFixed(1)} s`, perMin.toFixed(1), (perMin / workers).toFixed(1), [...new Set(where)].join(", ")];
  } finally {
    await Promise.all(started.map(stopWorker));
  }
}

async function main(): Promise<void> {
  const { token, labId } = await createBenchKey("hosts run");
  const table = [["workers", "captures", "analysed", "failed", "not final", "drain time", "captures/min", "per worker", "where the workers ran"]];
  let ok = true;
  try {
    for (const [round, workers] of ROUNDS.entries()) {
      const row = await runRound(token, labId, workers, round);
      table.push(row);
      ok &&= row[2] === row[1] && !row[8]?.includes("NOT");
    }
  } finally {
    await getAnalysisQueue().resume().catch(() => undefined);
    await closeAnalysisQueue();
    await closeDb();
  }
  printTable(`Backlog drained by workers on other hosts (mode ${args.mode}; services at ${new URL(getEnv().DATABASE_URL).hostname}; ${ROWS} rows per capture; drain time = queue resumed → last analysed, server-stamped)`, table);
  console.log(ok ? `\nhosts run${args.short ? " (short)" : ""}: every capture analysed by workers on other hosts` : "\nhosts run: some captures were not analysed, or a worker was not isolated");
  process.exitCode = ok ? 0 : 1;
}

void main();
