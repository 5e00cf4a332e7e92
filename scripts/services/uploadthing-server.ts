/**
 * Local fake of the uploadthing ingest and API service, for uploadthing 7.7.4's server SDK and
 * browser client (started by scripts/services.sh; protocol notes in docs/attachments.md).
 *
 *   node_modules/.bin/tsx scripts/services/uploadthing-server.ts --port 45700 --dir .data/uploadthing
 *
 * One port serves both base URLs the SDK is given (UPLOADTHING_INGEST_URL, UPLOADTHING_API_URL):
 *   HEAD|PUT  /<fileKey>?…&signature=…      presigned upload (multipart, Range: bytes=N-)
 *   POST      /route-metadata, /callback-result   from the app, x-uploadthing-api-key
 *   POST      /v6/deleteFiles|listFiles|getUsageInfo   UTApi, x-uploadthing-api-key
 *   GET|HEAD  /a/<appId>/<fileKey>, /f/<fileKey>       files (private ones need a signed URL)
 *   GET       /health                          liveness for scripts/services.sh (fake only)
 * Apps and their API keys are files in <dir>/apps/ (see store.ts); 127.0.0.1 only.
 */
import { createServer, type IncomingMessage, type ServerResponse } from "node:http";
import path from "node:path";
import { handleApi, handleCallbackResult, handleRouteMetadata } from "./uploadthing/api";
import { HttpFailure, sendJson, setCors } from "./uploadthing/http";
import { handleIngestHead, handleIngestPut, serveFile, type IngestContext } from "./uploadthing/ingest";
import { FakeStore } from "./uploadthing/store";
import { alsoListen, alsoListenHosts } from "./also-listen";

function arg(name: string, fallback: string): string {
  const i = process.argv.indexOf(`--${name}`);
  return (i >= 0 ? process.argv[i + 1] : undefined) ?? fallback;
}

const port = Number(arg("port", process.env.EMFOLIO_UPLOADTHING_PORT ?? "45700"));
const dir = path.resolve(arg("dir", ".data/uploadthing"));
const ctx: IngestContext = { store: new FakeStore(dir), origin: `http://127.0.0.1:${port}` };

async function route(req: IncomingMessage, res: ServerResponse): Promise<void> {
  const pathname = new URL(req.url ?? "/", "http://fake").pathname;
  const method = req.method ?? "GET";
  const parts = pathname.split("/").filter(Boolean);
  if (method === "OPTIONS") {
    res.writeHead(204);
    res.end();
    return;
  }
  if (pathname === "/health" && method === "GET") return sendJson(res, 200, { ok: true, service: "emfolio uploadthing fake", sdk: "7.7.4" });
  if (method === "POST") {
    if (pathname === "/route-metadata") return handleRouteMetadata(ctx.store, req, res);
    if (pathname === "/callback-result") return handleCallbackResult(ctx.store, req, res);
    if (parts.length === 2 && parts[0] === "v6") return handleApi(ctx.store, req, res, parts[1] as string);
  }
  if (method === "GET" || method === "HEAD") {
    if (parts.length === 3 && parts[0] === "a") return serveFile(ctx, req, res, parts[2] as string, parts[1] as string);
    if (parts.length === 2 && parts[0] === "f") return serveFile(ctx, req, res, parts[1] as string, null);
  }
  if (parts.length === 1 && method === "HEAD") return handleIngestHead(ctx, req, res, parts[0] as string);
  if (parts.length === 1 && method === "PUT") return handleIngestPut(ctx, req, res, parts[0] as string);
  throw new HttpFailure(404, `${method} ${pathname} is not part of the fake`);
}

const server = createServer((req, res) => {
  setCors(req, res);
  // Query strings carry signatures: log the path only.
  res.once("finish", () => console.log(`${new Date().toISOString()} ${req.method} ${req.url?.split("?")[0]} ${res.statusCode}`));
  route(req, res)
    .catch((err: unknown) => {
      const status = err instanceof HttpFailure ? err.status : 500;
      if (status === 500) console.error(`${new Date().toISOString()} ${req.method} ${req.url?.split("?")[0]}:`, err);
      if (!res.headersSent) sendJson(res, status, { error: err instanceof Error ? err.message : String(err) });
      else res.end();
    });
});

server.on("error", (err: Error & { code?: string }) => {
  console.error(`${new Date().toISOString()} uploadthing fake error:`, err.message);
  if (err.code === "EADDRINUSE" || err.code === "EACCES") process.exit(1);
});

server.listen(port, "127.0.0.1", () => {
  console.log(`${new Date().toISOString()} emfolio uploadthing fake listening on 127.0.0.1:${port}, storing in ${dir}`);
  alsoListen(server, alsoListenHosts(), port, (line) => console.log(`${new Date().toISOString()} ${line}`));
});

function shutdown(signal: string): void {
  console.log(`${new Date().toISOString()} ${signal}: closing`);
  server.close(() => process.exit(0));
  // Development streams stay open for up to an hour: do not wait for them.
  setTimeout(() => process.exit(0), 1000).unref();
}
process.on("SIGTERM", () => shutdown("SIGTERM"));
process.on("SIGINT", () => shutdown("SIGINT"));
