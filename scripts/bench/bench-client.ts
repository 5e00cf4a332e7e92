import { spawn, type ChildProcess } from "node:child_process";
import { findStationKeyByPrefix, insertStationKey } from "@/db/queries/station-keys";
import { listStations } from "@/db/queries/stations";
import { findActiveUserByEmail } from "@/db/queries/users";
import { demoUsers } from "@/db/seed-data";
import { generateStationKey } from "@/lib/server/hash";
import { childProcessEnv } from "@/lib/server/env";

// What the benchmark scripts share: a station key of the demo lab, bench-API calls, and worker
// processes started on the current env.

export async function createBenchKey(label: string): Promise<{ token: string; keyId: string; labId: string }> {
  const admin = await findActiveUserByEmail(demoUsers.find((u) => u.role === "admin")?.email ?? "");
  if (!admin) throw new Error("the demo lab manager is missing: seed the database first");
  const station = (await listStations({ kind: "lab", labId: admin.organisationId }))[0];
  if (!station) throw new Error("the lab has no bench");
  const key = generateStationKey();
  await insertStationKey({ stationId: station.id, prefix: key.prefix, secretHash: key.secretHash, label, createdById: admin.id });
  const row = await findStationKeyByPrefix(key.prefix);
  return { token: key.token, keyId: row?.key.id ?? "", labId: admin.organisationId };
}

export async function benchApi<T>(base: string, path: string, token: string, body: unknown): Promise<T> {
  const res = await fetch(`${base}${path}`, { method: "POST", headers: { Authorization: `Bearer ${token}`, "Content-Type": "application/json" }, body: JSON.stringify(body) });
  const json = (await res.json()) as T & { error?: string };
  if (!res.ok) throw new Error(`${path}: ${res.status} ${json.error ?? ""}`);
  return json;
}

const live = new Set<ChildProcess>();

/** `node --import tsx worker/index.ts` with one job at a time; resolves once it says it is ready. */
export function startBenchWorker(): Promise<ChildProcess> {
  const proc = spawn(process.execPath, ["--import", "tsx", "worker/index.ts"], { env: childProcessEnv({ WORKER_CONCURRENCY: "1" }), stdio: ["ignore", "pipe", "inherit"] });
  live.add(proc);
  proc.once("exit", () => live.delete(proc));
  return new Promise((resolve, reject) => {
    proc.stdout?.on("data", (d: Buffer) => { if (d.toString().includes("ready:")) resolve(proc); });
    proc.once("exit", (code) => reject(new Error(`worker exited (${code}) before it was ready`)));
  });
}

export const stopBenchWorker = (proc: ChildProcess) =>
  new Promise((r) => { if (proc.exitCode !== null) r(undefined); else { proc.once("exit", r); proc.kill("SIGTERM"); } });

/** For a script's finally: workers a failed run left behind would keep it from exiting. */
export const stopAllBenchWorkers = () => Promise.all([...live].map(stopBenchWorker));
