/**
 * The fault run's driver (scripts/faults/run.sh starts the services and sets the env): two worker
 * processes, captures sent through the bench API's route handlers (in this process, as the web app
 * runs them), and one fault at a time — PostgreSQL stopped (fast shutdown), the object store
 * stopped, Redis stopped, a worker killed with SIGKILL. Prints a table: fault, captures, analysed,
 * failed, lost, time to recover. Every loop is bounded; all traffic stays on loopback.
 *   tsx --import ./scripts/support/server-only-hook.mjs scripts/faults/drive.ts [--short]
 */
import { spawn, spawnSync, type ChildProcess } from "node:child_process";
import { createHash } from "node:crypto";
import { closeDb } from "@/db/queries/connection";
import { listBenchCaptureTimes } from "@/db/queries/captures";
import { POST as registerRoute } from "@/app/api/v1/captures/route";
import { POST as completeRoute } from "@/app/api/v1/captures/[id]/complete/route";
import { closeAnalysisQueue } from "@/lib/server/queue";
import { childProcessEnv } from "@/lib/server/env";
import { makeThreePhaseCsv } from "@/tests/fixtures/pipeline/make-capture";
import { createBenchKey } from "../bench/bench-client";
import { printTable } from "../bench/table";

type Fault = { name: string; service?: "postgres" | "s3" | "redis"; downS: number; kill?: boolean };

const short = process.argv.includes("--short");
const FAULTS: Fault[] = short
  ? [{ name: "PostgreSQL down 8 s", service: "postgres", downS: 8 }, { name: "object store down 8 s", service: "s3", downS: 8 },
     { name: "Redis down 4 s", service: "redis", downS: 4 }, { name: "worker kill -9", downS: 0, kill: true }]
  : [{ name: "PostgreSQL down 60 s", service: "postgres", downS: 60 }, { name: "object store down 60 s", service: "s3", downS: 60 },
     { name: "Redis down 30 s", service: "redis", downS: 30 }, { name: "worker kill -9", downS: 0, kill: true }];
const PER_FAULT = short ? 5 : 20;
/** A capture still not final this long after the fault ended counts as lost. */
const SETTLE_S = short ? 60 : 180;
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
const log = (line: string) => console.log(`${new Date().toISOString().slice(11, 19)} ${line}`);

const workers: ChildProcess[] = [];
function startWorker(): ChildProcess {
  // Its own process group, so SIGKILL takes the worker and its job processes at once (a host dying).
  const proc = spawn(process.execPath, ["--import", "tsx", "worker/index.ts"], {
    env: childProcessEnv({ WORKER_LOCK_MS: "5000", WORKER_SWEEP_INTERVAL_S: "5" }), stdio: ["ignore", "ignore", "ignore"], detached: true,
  });
  workers.push(proc);
  return proc;
}
function killGroup(proc: ChildProcess, signal: NodeJS.Signals): void {
  if (proc.pid && proc.exitCode === null) {
    try { process.kill(-proc.pid, signal); } catch { /* gone already */ }
  }
}
function service(action: "start" | "stop", name: string): void {
  const out = spawnSync("bash", ["scripts/services.sh", action, name], { encoding: "utf8" });
  if (out.status !== 0) throw new Error(`services.sh ${action} ${name}: ${out.stderr}`);
}

const json = (token: string, body: unknown) => ({ method: "POST", headers: { Authorization: `Bearer ${token}`, "Content-Type": "application/json" }, body: JSON.stringify(body) });

/**
 * Tries `step` until it answers (bounded: 150 tries a second apart, longer than an upload's 60 s
 * lease), as a bench PC would while a service is away.
 */
async function retried<T>(step: () => Promise<T>): Promise<T | null> {
  for (let attempt = 0; attempt < 150; attempt++) {
    try {
      return await step();
    } catch {
      await sleep(1_000);
    }
  }
  return null;
}

/** Register, PUT, complete: each step retried on its own, the PUT to the URL it was given. */
async function send(token: string, csv: string, serial: string): Promise<string | null> {
  const sha256 = createHash("sha256").update(csv).digest("hex");
  type Registered = { capture: { id: string; state: string }; upload?: { kind: string; url: string; headers: Record<string, string> } | null };
  const body = await retried(async () => {
    const reg = await registerRoute(new Request("http://faults/api/v1/captures",
      json(token, { unitSerial: serial, testKind: "no-load", fileName: "fault.csv", sizeBytes: Buffer.byteLength(csv), sha256 })));
    if (!reg.ok) throw new Error(`register ${reg.status}`);
    return (await reg.json()) as Registered;
  });
  if (!body) return null;
  const id = body.capture.id;
  if (body.capture.state !== "uploading") return id;
  const upload = body.upload;
  if (upload?.kind === "single") {
    const put = await retried(async () => {
      const res = await fetch(upload.url, { method: "PUT", headers: upload.headers, body: csv });
      // 412: the URL only takes this file's sha256 and the key holds an object: an earlier try landed.
      if (!res.ok && res.status !== 412) throw new Error(`PUT ${res.status}`);
      return true;
    });
    if (!put) return null;
  }
  const done = await retried(async () => {
    const res = await completeRoute(new Request(`http://faults/api/v1/captures/${id}/complete`, json(token, {})), { params: Promise.resolve({ id }) });
    if (!res.ok) throw new Error(`complete ${res.status}`);
    return true;
  });
  return done ? id : null;
}

async function runFault(fault: Fault, token: string, labId: string, variant: number): Promise<string[]> {
  log(`fault: ${fault.name}`);
  const ids: string[] = [];
  const sending = (async () => {
    for (let i = 0; i < PER_FAULT; i++) {
      const id = await send(token, makeThreePhaseCsv({ variant: variant + i, cycles: 200 }), "KG45-260302");
      if (id) ids.push(id);
      await sleep(short ? 200 : 500);
    }
  })();
  await sleep(short ? 500 : 3_000);
  const faultStart = Date.now();
  if (fault.kill) {
    const victim = workers.find((w) => w.exitCode === null);
    if (victim) killGroup(victim, "SIGKILL");
    await sleep(2_000);
    startWorker();
  } else if (fault.service) {
    service("stop", fault.service);
    await sleep(fault.downS * 1000);
    service("start", fault.service);
  }
  const restored = Date.now();
  await sending;
  let rows: Awaited<ReturnType<typeof listBenchCaptureTimes>> = [];
  let settled = false;
  for (const until = Date.now() + SETTLE_S * 1000; Date.now() < until;) {
    try {
      rows = await listBenchCaptureTimes({ kind: "lab", labId }, ids);
      if (rows.length === ids.length && rows.every((r) => r.state === "analysed" || r.state === "failed" || r.state === "rejected")) {
        settled = true;
        break;
      }
    } catch { /* the database may still be starting */ }
    await sleep(500);
  }
  const count = (state: string) => rows.filter((r) => r.state === state).length;
  const final = count("analysed") + count("failed") + count("rejected");
  const lost = ids.length - final;
  // Server-stamped: the last analysis of the batch, counted from the moment the fault ended.
  const lastAnalysed = Math.max(restored, ...rows.map((r) => r.analysedAt?.getTime() ?? 0));
  return [fault.name, String(ids.length), String(count("analysed")), String(count("failed") + count("rejected")), String(lost), String(PER_FAULT - ids.length),
    settled ? `${((lastAnalysed - restored) / 1000).toFixed(1)} s` : `> ${SETTLE_S} s`, `${((restored - faultStart) / 1000).toFixed(0)} s`];
}

async function main(): Promise<void> {
  const { token, labId } = await createBenchKey("fault run");
  startWorker();
  startWorker();
  await sleep(4_000);
  const table = [["fault", "captures", "analysed", "failed", "lost", "not sent", "time to recover", "fault lasted"]];
  let variant = Date.now() % 1_000_000;
  try {
    for (const fault of FAULTS) {
      table.push(await runFault(fault, token, labId, variant));
      variant += 1000;
    }
  } finally {
    for (const w of workers) killGroup(w, "SIGTERM");
    await Promise.all(workers.map((w) => (w.exitCode !== null ? null : new Promise((r) => { w.once("exit", r); setTimeout(() => { killGroup(w, "SIGKILL"); r(null); }, 20_000); }))));
    await closeAnalysisQueue();
    await closeDb();
  }
  printTable(`Faults (${short ? "short" : "full"} form): captures sent around each fault, 2 workers; time to recover = fault over → every capture final`, table);
  const bad = table.slice(1).some((row) => row[3] !== "0" || row[4] !== "0" || row[5] !== "0");
  console.log(bad ? "\nfault run: some captures failed or were lost" : "\nfault run: 0 failed, 0 lost");
  process.exitCode = bad ? 1 : 0;
}

void main();
