// The gate in front of the local S3 fake (s3rver, which checks no signature, checksum or length):
// every request must be signed with the configured credentials (SigV4, header or presigned form);
// a body must be exactly the declared bytes (length, signed payload hash, x-amz-checksum-sha256,
// Content-MD5) before any of it reaches the store; a PUT or completion sent with If-None-Match: *
// is refused when the key exists; a part or completion for an upload that was completed, aborted or
// never begun answers NoSuchUpload, and aborts are done here (s3rver answers 405); CORS is answered for the app's origins only; a full disk (or the
// test quota) answers 507 with a sentence and the process stays up.
import { rmSync, createReadStream } from "node:fs";
import http, { type IncomingMessage, type ServerResponse } from "node:http";
import { serveObjectGet } from "./direct-get";
import { checkBody, diskFull, folderBytes, isDiskFull, spoolBody, type Spooled } from "./body";
import { answerPreflight, corsHeaders } from "./cors";
import { S3Failure, sendError } from "./errors";
import { SignatureError, verifySignature, type Credentials } from "./sigv4";
import { abortUpload, objectTarget, requireOpenUpload } from "./uploads";

export type GateOptions = {
  credentials: Credentials;
  /** The store behind the gate. */
  backend: { host: string; port: number };
  /** Folder the store keeps its objects in (counted against the quota). */
  dataDir: string;
  spoolDir: string;
  origins: ReadonlySet<string>;
  /** Refuse writes that would take the store's folder over this many bytes (null: no quota). */
  quotaBytes: number | null;
  log: (line: string) => void;
};

const HOP_BY_HOP = new Set(["connection", "keep-alive", "transfer-encoding", "upgrade", "proxy-connection", "te", "trailer"]);

function forward(opts: GateOptions, req: IncomingMessage, res: ServerResponse, body: Spooled | null, cors: Record<string, string>): Promise<void> {
  return new Promise((resolve) => {
    const headers: Record<string, string | string[]> = {};
    for (const [k, v] of Object.entries(req.headers)) if (v !== undefined && !HOP_BY_HOP.has(k)) headers[k] = v;
    headers["content-length"] = String(body?.bytes ?? 0);
    const upstream = http.request({ ...opts.backend, method: req.method, path: req.url, headers }, (answer) => {
      const out: Record<string, string | string[]> = {};
      for (const [k, v] of Object.entries(answer.headers)) if (v !== undefined && !k.startsWith("access-control-") && !HOP_BY_HOP.has(k)) out[k] = v;
      res.writeHead(answer.statusCode ?? 502, { ...out, ...cors });
      answer.pipe(res);
      answer.on("end", resolve);
      answer.on("error", () => { res.destroy(); resolve(); });
    });
    upstream.on("error", (err) => {
      opts.log(`store behind the gate failed: ${err.message}`);
      sendError(res, 503, "ServiceUnavailable", "The store is unavailable; try again shortly", cors);
      resolve();
    });
    if (!body?.file) upstream.end();
    else createReadStream(body.file).on("error", (e) => upstream.destroy(e)).pipe(upstream);
  });
}

/** Whether the key already holds an object (a HEAD to the store, which reads no v4 signature). */
function keyExists(opts: GateOptions, path: string, host: string): Promise<boolean> {
  const stamp = new Date().toISOString().replace(/[-:]/g, "").replace(/\.\d+/, "");
  const auth = `AWS4-HMAC-SHA256 Credential=${opts.credentials.accessKeyId}/${stamp.slice(0, 8)}/${opts.credentials.region}/s3/aws4_request, SignedHeaders=host, Signature=${"0".repeat(64)}`;
  return new Promise((resolve, reject) => {
    const r = http.request({ ...opts.backend, method: "HEAD", path, headers: { host, authorization: auth, "x-amz-date": stamp, "x-amz-content-sha256": "UNSIGNED-PAYLOAD" } }, (answer) => {
      answer.resume();
      resolve(answer.statusCode === 200);
    });
    r.on("error", reject);
    r.end();
  });
}

async function handle(opts: GateOptions, req: IncomingMessage, res: ServerResponse): Promise<void> {
  const cors = corsHeaders(req.headers.origin, opts.origins);
  if (req.method === "OPTIONS") return answerPreflight(req, res, opts.origins);
  const verified = verifySignature({ method: req.method ?? "GET", url: req.url ?? "/", headers: req.headers }, opts.credentials);
  const url = new URL(req.url ?? "/", "http://store.invalid");
  const target = objectTarget(url.pathname);
  const objectPath = target !== null;
  const writes = req.method === "PUT" || req.method === "POST";
  const uploadId = url.searchParams.get("uploadId");
  if (target && uploadId !== null) {
    if (req.method === "DELETE") {
      abortUpload(opts.dataDir, target, uploadId);
      res.writeHead(204, cors);
      res.end();
      return;
    }
    if (writes) requireOpenUpload(opts.dataDir, target, uploadId);
  }
  if (req.method === "GET" && target && uploadId === null && serveObjectGet(opts.dataDir, target, url, req, res, cors)) return;
  let body: Spooled | null = null;
  try {
    if (writes) {
      const length = req.headers["content-length"];
      if (req.method === "PUT" && length === undefined) throw new S3Failure(411, "MissingContentLength", "You must provide the Content-Length HTTP header");
      if (opts.quotaBytes !== null && Number(length ?? 0) > 0) {
        const used = folderBytes(opts.dataDir) + folderBytes(opts.spoolDir);
        if (used + Number(length) > opts.quotaBytes) throw diskFull(`${used} of ${opts.quotaBytes} bytes are used and this request brings ${length}`);
      }
      body = await spoolBody(req, opts.spoolDir);
      checkBody(body, req.headers, verified.payloadSha256Hex);
    }
    const completes = req.method === "POST" && url.searchParams.has("uploadId");
    const putsObject = req.method === "PUT" && !url.searchParams.has("partNumber");
    if (objectPath && (putsObject || completes) && req.headers["if-none-match"] === "*") {
      if (await keyExists(opts, url.pathname, req.headers.host ?? "")) {
        throw new S3Failure(412, "PreconditionFailed", "An object is already stored under this key and this upload may not replace it");
      }
    }
    await forward(opts, req, res, body, cors);
  } finally {
    if (body?.file) rmSync(body.file, { force: true });
  }
}

/**
 * Runs `answer` once the request's body has been read (discarded), or after a few seconds: a
 * refusal sent while the client is still writing its body would reach it as EPIPE, not as the answer.
 */
function afterBody(req: IncomingMessage, answer: () => void): void {
  let done = false;
  const once = (): void => {
    if (done) return;
    done = true;
    clearTimeout(timer);
    answer();
  };
  const timer = setTimeout(once, 5_000);
  if (req.complete) return once();
  req.once("end", once);
  req.once("error", once);
  req.once("close", once);
  req.resume();
}

export function createGate(opts: GateOptions): http.Server {
  const server = http.createServer((req, res) => {
    handle(opts, req, res).catch((err: unknown) => afterBody(req, () => {
      const cors = corsHeaders(req.headers.origin, opts.origins);
      if (err instanceof SignatureError || err instanceof S3Failure) {
        opts.log(`${req.method} ${(req.url ?? "").split("?")[0]}: ${err.status} ${err.code}`);
        sendError(res, err.status, err.code, err.message, cors);
      } else if (isDiskFull(err)) {
        const full = diskFull("the store could not write");
        sendError(res, full.status, full.code, full.message, cors);
      } else {
        opts.log(`${req.method} ${(req.url ?? "").split("?")[0]}: internal error ${err instanceof Error ? err.stack : String(err)}`);
        sendError(res, 500, "InternalError", "The store failed to handle the request; nothing was stored", cors);
      }
    }));
  });
  server.requestTimeout = 10 * 60 * 1000;
  server.headersTimeout = 60 * 1000;
  return server;
}
