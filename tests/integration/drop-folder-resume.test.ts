import { execFile, spawn } from "node:child_process";
import { createHash } from "node:crypto";
import { existsSync, mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import http from "node:http";
import type { AddressInfo } from "node:net";
import { tmpdir } from "node:os";
import path from "node:path";
import { promisify } from "node:util";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getCaptureDetail } from "@/db/queries/captures";
import { POST as registerRoute } from "@/app/api/v1/captures/route";
import { POST as completeRoute } from "@/app/api/v1/captures/[id]/complete/route";
import { POST as partsRoute } from "@/app/api/v1/captures/[id]/parts/route";
import { bareChildEnv, getEnv } from "@/lib/server/env";
import { openObjectStream } from "@/lib/server/storage";
import { makeThreePhaseCsv } from "@/tests/fixtures/pipeline/make-capture";
import { closeConnections, demoLabStation, sha256 } from "./pipeline-support";

// The drop-folder uploader resuming: the object store stopped mid-upload and started again, the
// bench API and the store answering 429/503 with Retry-After, and the message when it gives up.
// The bench API's route handlers are served over HTTP here; `fault` lets a test answer for them,
// and `viaStoreProxy` sends upload URLs through a proxy that can answer for the store.

let labId: string;
let token: string;
let api: http.Server;
let base: string;
let storeProxy: http.Server;
let proxyBase: string;
type Fault = { status: number; retryAfter: string } | null;
let fault: (what: "api" | "store", method: string, pathname: string) => Fault = () => null;
let viaStoreProxy = false;
const seen: { what: string; method: string; pathname: string; at: number; status: number }[] = [];

async function route(req: http.IncomingMessage, body: Uint8Array<ArrayBuffer>): Promise<Response> {
  const url = new URL(req.url ?? "/", base);
  const injected = fault("api", req.method ?? "", url.pathname);
  if (injected) return Response.json({ error: "The server is busy" }, { status: injected.status, headers: { "Retry-After": injected.retryAfter } });
  const request = new Request(url, { method: req.method, headers: req.headers as Record<string, string>, ...(body.length ? { body } : {}) });
  const match = /^\/api\/v1\/captures(?:\/([^/]+)\/(complete|parts))?$/.exec(url.pathname);
  if (!match) return new Response("{}", { status: 404 });
  const params = { params: Promise.resolve({ id: match[1] ?? "" }) };
  const answer = !match[1] ? await registerRoute(request) : match[2] === "complete" ? await completeRoute(request, params) : await partsRoute(request, params);
  if (!viaStoreProxy) return answer;
  const text = (await answer.text()).replaceAll(new URL(getEnv().S3_ENDPOINT).origin, proxyBase);
  return new Response(text, { status: answer.status, headers: answer.headers });
}

/** Forwards to the store with the Host the URL was signed for, unless `fault` answers first. */
function proxyToStore(req: http.IncomingMessage, res: http.ServerResponse): void {
  const url = new URL(req.url ?? "/", proxyBase);
  const injected = fault("store", req.method ?? "", url.pathname);
  seen.push({ what: "store", method: req.method ?? "", pathname: url.pathname, at: Date.now(), status: injected?.status ?? 0 });
  if (injected) {
    req.resume();
    res.writeHead(injected.status, { "Retry-After": injected.retryAfter, "Content-Type": "application/xml", Connection: "close" });
    res.end("<Error><Code>SlowDown</Code><Message>Please reduce your request rate</Message></Error>");
    return;
  }
  const store = new URL(getEnv().S3_ENDPOINT);
  const upstream = http.request({ host: store.hostname, port: store.port, method: req.method, path: req.url, headers: { ...req.headers, host: store.host } }, (answer) => {
    res.writeHead(answer.statusCode ?? 502, answer.headers);
    answer.pipe(res);
  });
  upstream.on("error", () => res.destroy());
  req.pipe(upstream);
}

function dropFolder(folder: string, ...args: string[]): Promise<{ status: number | null; output: string }> {
  return new Promise((resolve) => {
    const child = spawn(process.execPath, ["scripts/drop-folder.mjs", "--folder", folder, "--server", base, "--settle", "0.3", "--poll", "0.2", "--once", ...args], {
      env: bareChildEnv({ EMFOLIO_STATION_KEY: token }), stdio: ["ignore", "pipe", "pipe"],
    });
    let output = "";
    child.stdout.on("data", (d: Buffer) => (output += d.toString()));
    child.stderr.on("data", (d: Buffer) => (output += d.toString()));
    child.on("exit", (status) => resolve({ status, output }));
  });
}

/** Starts or stops the local object store itself (the suite's services; test files run one at a time). */
function storeService(action: "stop" | "start") {
  const env = bareChildEnv({ EMFOLIO_S3_PORT: new URL(getEnv().S3_ENDPOINT).port, EMFOLIO_E2E_PORT: new URL(getEnv().NEXTAUTH_URL).port || "3100" });
  return promisify(execFile)("bash", ["scripts/services.sh", action, "s3"], { env, timeout: 90_000 });
}

async function storedSha256(captureId: string): Promise<string> {
  const { capture } = (await getCaptureDetail({ kind: "lab", labId }, captureId))!;
  const hash = createHash("sha256");
  for await (const chunk of await openObjectStream(capture.objectKey, { etag: capture.objectEtag ?? undefined })) hash.update(chunk as Buffer);
  return hash.digest("hex");
}

const captureIdIn = (output: string) => /capture ([0-9a-f-]{36})/.exec(output)?.[1] ?? "";

beforeAll(async () => {
  ({ labId, token } = await demoLabStation());
  const serve = (handler: http.RequestListener) => http.createServer(handler);
  api = serve((req, res) => {
    const chunks: Buffer[] = [];
    req.on("data", (c: Buffer) => chunks.push(c));
    req.on("end", () => {
      route(req, Buffer.concat(chunks))
        .then(async (response) => {
          seen.push({ what: "api", method: req.method ?? "", pathname: req.url ?? "", at: Date.now(), status: response.status });
          res.writeHead(response.status, Object.fromEntries(response.headers));
          res.end(Buffer.from(await response.arrayBuffer()));
        })
        .catch(() => res.writeHead(500).end("{}"));
    });
  });
  storeProxy = serve(proxyToStore);
  await new Promise<void>((resolve) => api.listen(0, "127.0.0.1", resolve));
  await new Promise<void>((resolve) => storeProxy.listen(0, "127.0.0.1", resolve));
  base = `http://127.0.0.1:${(api.address() as AddressInfo).port}`;
  proxyBase = `http://127.0.0.1:${(storeProxy.address() as AddressInfo).port}`;
});

afterAll(async () => {
  await new Promise((resolve) => api?.close(resolve));
  await new Promise((resolve) => storeProxy?.close(resolve));
  await closeConnections();
});

describe("scripts/drop-folder.mjs resuming", () => {
  it("drop-folder resumes a multipart upload after the object store was stopped mid-upload and started again; the stored file has the file's sha256", async () => {
    const folder = mkdtempSync(path.join(tmpdir(), "emfolio-resume-"));
    const csv = makeThreePhaseCsv({ cycles: 4800, variant: Date.now() % 100_000 });
    expect(Buffer.byteLength(csv)).toBeGreaterThan(32 * 1024 ** 2);
    writeFileSync(path.join(folder, "KG45-260306_no-load_1500rpm_resume.csv"), csv);
    const stateFile = path.join(folder, ".drop-folder-state.json");
    const running = dropFolder(folder, "--limit-kib-s", "6144", "--max-attempts", "30");
    // Once the first part is stored, the store goes away for a few seconds.
    for (let i = 0; i < 600; i++) {
      const state = existsSync(stateFile) ? (JSON.parse(readFileSync(stateFile, "utf8")) as { pending: Record<string, { etags: Record<string, string> }> }) : null;
      if (Object.values(state?.pending ?? {}).some((p) => Object.keys(p.etags ?? {}).length >= 1)) break;
      await new Promise((r) => setTimeout(r, 100));
    }
    await storeService("stop");
    await new Promise((r) => setTimeout(r, 3000));
    await storeService("start");
    const { status, output } = await running;
    expect(status, output).toBe(0);
    // A part was cut off or refused while the store was away, and was sent again.
    expect(output).toMatch(/retry\s+\S+, part \d+: [^\n]*(ECONNRESET|ECONNREFUSED|connection lost|hang up)/);
    const id = captureIdIn(output);
    const { capture } = (await getCaptureDetail({ kind: "lab", labId }, id))!;
    expect(["queued", "analysing", "analysed"]).toContain(capture.state);
    expect(capture.sha256).toBe(sha256(csv));
    expect(await storedSha256(id)).toBe(sha256(csv));
  }, 240_000);

  it("drop-folder waits out 429 and 503 answers as Retry-After says, then sends the file", async () => {
    const folder = mkdtempSync(path.join(tmpdir(), "emfolio-busy-"));
    const csv = makeThreePhaseCsv({ variant: 100_000 + (Date.now() % 100_000) });
    writeFileSync(path.join(folder, "KG45-260306_no-load_1500rpm_busy.csv"), csv);
    let apiRefusals = 0;
    let storeRefusals = 0;
    viaStoreProxy = true;
    fault = (what, method) => {
      if (what === "api" && method === "POST" && apiRefusals < 1) return (apiRefusals++, { status: 429, retryAfter: "1" });
      if (what === "store" && method === "PUT" && storeRefusals < 2) return (storeRefusals++, { status: 503, retryAfter: "1" });
      return null;
    };
    seen.length = 0;
    const { status, output } = await dropFolder(folder);
    viaStoreProxy = false;
    fault = () => null;
    expect(status, output).toBe(0);
    const puts = seen.filter((s) => s.what === "store" && s.method === "PUT");
    expect(puts.map((p) => p.status)).toEqual([503, 503, 0]);
    // Each try after a refusal comes no sooner than Retry-After (1 s) says.
    expect(puts[1]!.at - puts[0]!.at).toBeGreaterThanOrEqual(950);
    expect(puts[2]!.at - puts[1]!.at).toBeGreaterThanOrEqual(950);
    const posts = seen.filter((s) => s.what === "api" && s.method === "POST");
    expect(posts[0]?.status).toBe(429);
    expect(posts[1]!.at - posts[0]!.at).toBeGreaterThanOrEqual(950);
    expect(await storedSha256(captureIdIn(output))).toBe(sha256(csv));
  }, 60_000);

  it("drop-folder gives up on a store that keeps answering 503 after a bounded number of tries, says so, and leaves the file", async () => {
    const folder = mkdtempSync(path.join(tmpdir(), "emfolio-giveup-"));
    const file = path.join(folder, "KG45-260306_no-load_1500rpm_giveup.csv");
    writeFileSync(file, makeThreePhaseCsv({ variant: 200_000 + (Date.now() % 100_000) }));
    viaStoreProxy = true;
    fault = (what, method) => (what === "store" && method === "PUT" ? { status: 503, retryAfter: "0" } : null);
    seen.length = 0;
    const { status, output } = await dropFolder(folder, "--max-attempts", "1");
    viaStoreProxy = false;
    fault = () => null;
    expect(status).toBe(1);
    expect(seen.filter((s) => s.what === "store" && s.method === "PUT")).toHaveLength(5);
    expect(output).toMatch(/gave up after 5 tries \(last: 503: storage refused the upload: SlowDown\)/);
    expect(output).toMatch(/left in the folder after 1 failed attempts/);
    expect(existsSync(file)).toBe(true);
  }, 60_000);
});
