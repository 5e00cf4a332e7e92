import { bareChildEnv } from "@/lib/server/env";
import { spawn } from "node:child_process";
import { existsSync, mkdtempSync, readFileSync, readdirSync, writeFileSync } from "node:fs";
import http from "node:http";
import type { AddressInfo } from "node:net";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { and, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { captures } from "@/db/schema";
import { POST as registerRoute } from "@/app/api/v1/captures/route";
import { POST as completeRoute } from "@/app/api/v1/captures/[id]/complete/route";
import { POST as partsRoute } from "@/app/api/v1/captures/[id]/parts/route";
import { makeThreePhaseCsv } from "@/tests/fixtures/pipeline/make-capture";
import { closeConnections, demoLabStation, sha256, startWorker, unitId, waitForState, type WorkerProcess } from "./pipeline-support";

// The drop-folder uploader as a real process against the bench API's route handlers (served over
// HTTP here), the real database, object store, queue and worker.

let worker: WorkerProcess;
let labId: string;
let token: string;
let server: http.Server;
let base: string;
const run = Date.now();

async function toResponse(req: http.IncomingMessage): Promise<Response> {
  const chunks: Buffer[] = [];
  for await (const chunk of req) chunks.push(chunk as Buffer);
  const url = new URL(req.url ?? "/", base);
  const request = new Request(url, { method: req.method, headers: req.headers as Record<string, string>, ...(chunks.length ? { body: Buffer.concat(chunks) } : {}) });
  const match = /^\/api\/v1\/captures(?:\/([^/]+)\/(complete|parts))?$/.exec(url.pathname);
  if (!match) return new Response("{}", { status: 404 });
  if (!match[1]) return registerRoute(request);
  const params = { params: Promise.resolve({ id: match[1] }) };
  return match[2] === "complete" ? completeRoute(request, params) : partsRoute(request, params);
}

function dropFolder(folder: string, ...args: string[]): Promise<{ status: number | null; output: string }> {
  return new Promise((resolve) => {
    const child = spawn(process.execPath, ["scripts/drop-folder.mjs", "--folder", folder, "--server", base, "--settle", "0.3", "--poll", "0.2", "--once", ...args], {
      env: bareChildEnv({ EMFOLIO_STATION_KEY: token }),
      stdio: ["ignore", "pipe", "pipe"],
    });
    let output = "";
    child.stdout.on("data", (d: Buffer) => (output += d.toString()));
    child.stderr.on("data", (d: Buffer) => (output += d.toString()));
    child.on("exit", (status) => resolve({ status, output }));
  });
}

async function capturesOf(serial: string, csv: string) {
  const unit = await unitId(labId, serial);
  return getDb().select().from(captures).where(and(eq(captures.unitId, unit), eq(captures.sha256, sha256(csv))));
}

beforeAll(async () => {
  ({ labId, token } = await demoLabStation());
  worker = await startWorker();
  server = http.createServer((req, res) => {
    toResponse(req)
      .then(async (response) => {
        res.writeHead(response.status, Object.fromEntries(response.headers));
        res.end(Buffer.from(await response.arrayBuffer()));
      })
      .catch(() => res.writeHead(500).end("{}"));
  });
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
  base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
});

afterAll(async () => {
  await worker?.stop();
  await new Promise((resolve) => server?.close(resolve));
  await closeConnections();
});

describe("scripts/drop-folder.mjs against the bench API", () => {
  it("drop-folder --once sends dropped files, which end analysed, and moves them to sent/", async () => {
    const folder = mkdtempSync(path.join(tmpdir(), "emfolio-drop-"));
    const a = makeThreePhaseCsv({ variant: (run % 1000) + 11 });
    const b = makeThreePhaseCsv({ variant: (run % 1000) + 12 });
    writeFileSync(path.join(folder, "KG45-260301_no-load_1500rpm_a.csv"), a);
    writeFileSync(path.join(folder, "KG45-260302.csv"), b);
    writeFileSync(path.join(folder, "KG45-260302.csv.json"), JSON.stringify({ unitSerial: "KG45-260302", testKind: "no-load", speedRpm: 1500 }));
    const result = await dropFolder(folder);
    expect(result.status, result.output).toBe(0);
    for (const [serial, csv] of [["KG45-260301", a], ["KG45-260302", b]] as const) {
      const rows = await capturesOf(serial, csv);
      expect(rows).toHaveLength(1);
      expect(rows[0]!.speedRpm).toBe(1500);
      const done = await waitForState(labId, rows[0]!.id, ["analysed", "rejected", "failed"]);
      expect(done.state, done.stateMessage ?? "").toBe("analysed");
    }
    expect(readdirSync(path.join(folder, "sent")).sort()).toEqual(["KG45-260301_no-load_1500rpm_a.csv", "KG45-260302.csv", "KG45-260302.csv.json"]);
    expect(readFileSync(path.join(folder, "drop-folder.log"), "utf8")).toMatch(/sent\s+KG45-260301_no-load_1500rpm_a\.csv: capture [0-9a-f-]{36}/);
  });

  it("drop-folder sends the same file dropped twice once: one capture, the second copy moved to sent/ as already sent", async () => {
    const folder = mkdtempSync(path.join(tmpdir(), "emfolio-drop-"));
    const csv = makeThreePhaseCsv({ variant: (run % 1000) + 13 });
    writeFileSync(path.join(folder, "KG45-260303_no-load_1500rpm.csv"), csv);
    expect((await dropFolder(folder)).status).toBe(0);
    writeFileSync(path.join(folder, "KG45-260303_no-load_1500rpm.csv"), csv);
    const second = await dropFolder(folder);
    expect(second.status, second.output).toBe(0);
    expect(await capturesOf("KG45-260303", csv)).toHaveLength(1);
    expect(readdirSync(path.join(folder, "sent"))).toHaveLength(2);
    expect(second.output).toContain("(already stored)");
  });

  it("drop-folder moves a file whose name matches no pattern (and has no sidecar) to refused/ with the reason beside it", async () => {
    const folder = mkdtempSync(path.join(tmpdir(), "emfolio-drop-"));
    writeFileSync(path.join(folder, "scope export 7.csv"), makeThreePhaseCsv({ variant: (run % 1000) + 14 }));
    const result = await dropFolder(folder);
    expect(result.status, result.output).toBe(0);
    expect(existsSync(path.join(folder, "refused", "scope export 7.csv"))).toBe(true);
    expect(readFileSync(path.join(folder, "refused", "scope export 7.csv.reason.txt"), "utf8")).toMatch(/does not match the name pattern/);
    expect(readFileSync(path.join(folder, "drop-folder.log"), "utf8")).toMatch(/refused\s+scope export 7\.csv/);
  });

  it("drop-folder refuses a key file others may read, and takes no key from the command line", async () => {
    const folder = mkdtempSync(path.join(tmpdir(), "emfolio-drop-"));
    const keyFile = path.join(folder, "key");
    writeFileSync(keyFile, token, { mode: 0o644 });
    const loose = await dropFolder(folder, "--key-file", keyFile);
    expect([loose.status, loose.output]).toEqual([2, expect.stringContaining("readable by others")]);
    const onLine = await dropFolder(folder, "--key", token);
    expect(onLine.status).toBe(2);
    expect(onLine.output).toContain("--key");
  });
});
