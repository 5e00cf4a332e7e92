import { spawn, type ChildProcess } from "node:child_process";
import { createHash } from "node:crypto";
import { eq } from "drizzle-orm";
import { closeDb, getDb } from "@/db/client";
import { getCaptureDetail } from "@/db/queries/captures";
import { insertStationKey } from "@/db/queries/station-keys";
import { listStations } from "@/db/queries/stations";
import { getUnitBySerial } from "@/db/queries/units";
import { organisations, stations, users, type CaptureState } from "@/db/schema";
import type { SessionUser } from "@/lib/auth/options";
import { actorForStoredUser, type Actor } from "@/lib/dal/actor";
import { findActiveUserByEmail } from "@/db/queries/users";
import { demoUsers } from "@/db/seed-data";
import { generateStationKey } from "@/lib/server/hash";
import { childProcessEnv } from "@/lib/server/env";
import { closeAnalysisQueue } from "@/lib/server/queue";
import { POST as registerRoute } from "@/app/api/v1/captures/route";
import { POST as completeRoute } from "@/app/api/v1/captures/[id]/complete/route";
import { POST as partsRoute } from "@/app/api/v1/captures/[id]/parts/route";
import type { UploadPlan } from "@/lib/captures/input-schemas";
import { seededOrgs } from "./helpers";

// Helpers for the pipeline tests: bench-API calls through the real route handlers, a real
// worker process, and polling of the database (the source of truth).

export const sha256 = (text: string) => createHash("sha256").update(text).digest("hex");

/** The seeded lab and a fresh station key of its first bench (for a file's beforeAll). */
export async function demoLabStation(): Promise<{ labId: string; token: string }> {
  const labId = (await seededOrgs()).lab.id;
  return { labId, token: (await createStationToken(labId)).token };
}

/** Closes the queue and the pool (for a file's afterAll). */
export async function closeConnections(): Promise<void> {
  await closeAnalysisQueue();
  await closeDb();
}

export async function createStationToken(labId: string): Promise<{ token: string; stationId: string }> {
  const station = (await listStations({ kind: "lab", labId }))[0];
  const admin = (await getDb().select().from(users).where(eq(users.organisationId, labId)).limit(1))[0];
  if (!station || !admin) throw new Error("the lab has no bench or no user: run the seed first");
  const key = generateStationKey();
  await insertStationKey({ stationId: station.id, prefix: key.prefix, secretHash: key.secretHash, label: "pipeline test", createdById: admin.id });
  return { token: key.token, stationId: station.id };
}

export async function unitId(labId: string, serial: string): Promise<string> {
  const found = await getUnitBySerial({ kind: "lab", labId }, serial);
  if (!found) throw new Error(`no seeded unit ${serial}`);
  return found.unit.id;
}

const jsonRequest = (url: string, token: string, body: unknown) =>
  new Request(url, { method: "POST", headers: { Authorization: `Bearer ${token}`, "Content-Type": "application/json" }, body: JSON.stringify(body) });

export type Registered = { status: number; body: { capture?: { id: string; state: string }; duplicate?: boolean; upload?: UploadPlan | null; error?: string } };

export async function registerViaApi(token: string, csv: string, meta: Record<string, unknown>): Promise<Registered> {
  const res = await registerRoute(jsonRequest("http://test/api/v1/captures", token, {
    testKind: "no-load", fileName: "capture.csv", sizeBytes: Buffer.byteLength(csv), sha256: sha256(csv), ...meta,
  }));
  return { status: res.status, body: await res.json() };
}

/** A part URL bound to the part's bytes (their sha256), as the bench API issues it; `sha256Hex` defaults to that of `body`. */
export async function partUrlViaApi(token: string, id: string, partNumber: number, body: Uint8Array<ArrayBuffer>, sha256Hex?: string) {
  const sum = sha256Hex ?? createHash("sha256").update(body).digest("hex");
  const res = await partsRoute(jsonRequest(`http://test/api/v1/captures/${id}/parts`, token, { parts: [{ partNumber, sha256: sum }] }), { params: Promise.resolve({ id }) });
  const json = (await res.json()) as { parts?: { partNumber: number; url: string; headers: Record<string, string> }[]; error?: string };
  const part = json.parts?.[0];
  if (!part) throw new Error(`part URL refused: ${res.status} ${json.error}`);
  return { ...part, sha256: sum };
}

/** PUTs one part through a bound URL; returns what completion needs. */
export async function putPartViaApi(token: string, id: string, partNumber: number, body: Uint8Array<ArrayBuffer>) {
  const part = await partUrlViaApi(token, id, partNumber, body);
  const put = await fetch(part.url, { method: "PUT", headers: part.headers, body });
  if (!put.ok) throw new Error(`PUT part ${partNumber} failed: ${put.status} ${await put.text()}`);
  return { partNumber, etag: put.headers.get("etag") ?? "", sha256: part.sha256 };
}

export async function completeViaApi(token: string, id: string, parts?: { partNumber: number; etag: string; sha256?: string }[]) {
  const res = await completeRoute(jsonRequest(`http://test/api/v1/captures/${id}/complete`, token, { parts }), { params: Promise.resolve({ id }) });
  return { status: res.status, body: (await res.json()) as { state?: string; error?: string } };
}

/** Register → PUT to the presigned URL → complete, as a bench script would. */
export async function uploadViaApi(token: string, csv: string, meta: Record<string, unknown>) {
  const reg = await registerViaApi(token, csv, meta);
  if (!reg.body.capture) throw new Error(`register failed: ${reg.status} ${reg.body.error}`);
  const upload = reg.body.upload;
  let parts: { partNumber: number; etag: string; sha256: string }[] | undefined;
  if (upload?.kind === "single") {
    const put = await fetch(upload.url, { method: "PUT", headers: upload.headers, body: csv });
    if (!put.ok) throw new Error(`PUT failed: ${put.status}`);
  } else if (upload?.kind === "multipart") {
    const bytes = Buffer.from(csv);
    parts = [];
    for (let n = 1; n <= upload.partCount; n++) {
      parts.push(await putPartViaApi(token, reg.body.capture.id, n, bytes.subarray((n - 1) * upload.partSize, n * upload.partSize)));
    }
  }
  const id = reg.body.capture.id;
  const done = await completeViaApi(token, id, parts);
  return { id, register: reg, completeStatus: done.status, complete: done.body };
}

export async function waitForState(labId: string, captureId: string, states: CaptureState[], timeoutMs = 45_000) {
  const until = Date.now() + timeoutMs;
  for (;;) {
    const found = await getCaptureDetail({ kind: "lab", labId }, captureId);
    if (found && states.includes(found.capture.state)) return found.capture;
    if (Date.now() > until) throw new Error(`capture ${captureId} stayed ${found?.capture.state} (${found?.capture.stateMessage ?? ""})`);
    await new Promise((r) => setTimeout(r, 200));
  }
}

export type WorkerProcess = { proc: ChildProcess; output: () => string; stop: () => Promise<void>; kill: () => Promise<void> };

/** Starts `node --import tsx worker/index.ts` on the test env and waits until it says it is ready. */
export async function startWorker(extraEnv: Record<string, string> = {}): Promise<WorkerProcess> {
  const proc = spawn(process.execPath, ["--import", "tsx", "worker/index.ts"], {
    env: childProcessEnv({ WORKER_LOCK_MS: "3000", WORKER_SWEEP_INTERVAL_S: "2", ...extraEnv }),
    stdio: ["ignore", "pipe", "pipe"],
  });
  let out = "";
  proc.stdout?.on("data", (d: Buffer) => (out += d.toString()));
  proc.stderr?.on("data", (d: Buffer) => (out += d.toString()));
  const exited = new Promise<void>((resolve) => proc.once("exit", () => resolve()));
  const until = Date.now() + 30_000;
  while (!out.includes("ready:")) {
    if (proc.exitCode !== null || Date.now() > until) throw new Error(`the worker did not start:\n${out}`);
    await new Promise((r) => setTimeout(r, 100));
  }
  return {
    proc,
    output: () => out,
    stop: async () => {
      if (proc.exitCode === null) proc.kill("SIGTERM");
      const timer = setTimeout(() => proc.kill("SIGKILL"), 20_000);
      await exited;
      clearTimeout(timer);
    },
    kill: async () => { if (proc.exitCode === null) proc.kill("SIGKILL"); await exited; },
  };
}

/** A second lab with one operator and one bench, so cross-organisation reads can be tried. */
export async function createOtherLab(tag: string) {
  const [org] = await getDb().insert(organisations).values({ name: `Other lab ${tag}`, slug: `other-lab-${tag}`, kind: "lab" }).returning();
  if (!org) throw new Error("could not create the second lab");
  const [user] = await getDb()
    .insert(users)
    .values({ email: `op-${tag}@other-lab.example`, name: "Other Operator", role: "operator", organisationId: org.id, passwordHash: "x" })
    .returning();
  await getDb().insert(stations).values({ labId: org.id, name: "Other bench" });
  if (!user) throw new Error("could not create the second lab's operator");
  const sessionUser: SessionUser = {
    id: user.id, name: user.name, email: user.email, role: "operator", organisationId: org.id, organisationName: org.name, organisationKind: "lab",
  };
  return { org, sessionUser };
}

/** The actor of a seeded demo account of the given role (looked up in the database, like a session). */
export async function demoActor(role: "admin" | "operator" | "qa" | "manufacturer"): Promise<Actor> {
  const email = demoUsers.find((u) => u.role === role)?.email;
  const row = email ? await findActiveUserByEmail(email) : undefined;
  if (!row) throw new Error(`no seeded ${role}: run the seed first`);
  return actorForStoredUser(row.id);
}
