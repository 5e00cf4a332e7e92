// Serves the built app like `next start`, but decides the client's address itself: X-Forwarded-For is
// replaced by the socket's address, or, when the socket is a proxy listed in TRUSTED_PROXIES, by the
// address that proxy reports. `next start` keeps whatever X-Forwarded-For a client sends, which let
// anyone pick the address the per-address sign-in limits count.
// The health probes are answered here, before Next (lib/server/health-probe.ts): through Next's proxy
// and routing they stayed near 300 requests/s on this machine's two shared cores, 500 being the target.
// One Node process renders on one core: `--processes N` forks N of them sharing the
// port (node:cluster), one per core the web tier may use; a process that dies is replaced.
// Usage: tsx scripts/serve.ts [--host 127.0.0.1] [--port 3000] [--processes 1]
import cluster from "node:cluster";
import http from "node:http";
import { parseArgs } from "node:util";
import next from "next";
import { clientAddressOf, parseTrustedProxies } from "@/lib/server/client-address";
import { getEnv } from "@/lib/server/env";
import { answerProbe } from "@/lib/server/health-probe";

const { values } = parseArgs({
  options: { host: { type: "string", default: "127.0.0.1" }, port: { type: "string", default: "3000" }, processes: { type: "string", default: "1" } },
});
const host = values.host;
const port = Number(values.port);
const processes = Number(values.processes);
if (!Number.isInteger(processes) || processes < 1 || processes > 64) {
  console.error(`--processes must be a whole number from 1 to 64, not "${values.processes}"`);
  process.exit(2);
}

if (processes > 1 && cluster.isPrimary) {
  for (let i = 0; i < processes; i++) cluster.fork();
  let stopping = false;
  const stopAll = (code: number) => {
    stopping = true;
    for (const worker of Object.values(cluster.workers ?? {})) worker?.process.kill("SIGTERM");
    process.exit(code);
  };
  // A process that exits by itself before it listens (a missing setting, a missing build) would do so
  // again, so the primary stops rather than re-forking for ever; one that served, or was killed, is replaced.
  const served = new Set<number>();
  cluster.on("listening", (worker) => {
    served.add(worker.id);
    if (served.size === processes) console.log(`Emfolio on http://${host}:${port} (${processes} processes)`);
    else if (served.size > processes) console.log(`web process ${worker.process.pid} listening in place of one that ended`);
  });
  cluster.on("exit", (worker, code, signal) => {
    if (stopping) return;
    if (!served.has(worker.id) && signal === null) {
      console.error(`web process ${worker.process.pid} ended (${code}) before it listened; stopping`);
      stopAll(1);
      return;
    }
    console.error(`web process ${worker.process.pid} ended (${signal ?? code}); starting another`);
    cluster.fork();
  });
  for (const signal of ["SIGTERM", "SIGINT"] as const) process.on(signal, () => stopAll(0));
} else {
  const app = next({ dev: false, hostname: host, port });
  // prepare() installs Next's uncaughtException handler, which logs and carries on: a start-up failure
  // must end the process with status 1 itself (a cluster process would otherwise idle, never listening).
  const started = await (async () => {
    await app.prepare();
    // After prepare(): Next has loaded .env files by then, as `next start` does.
    return { handle: app.getRequestHandler(), trusted: parseTrustedProxies(getEnv().TRUSTED_PROXIES) };
  })().catch((error: unknown) => {
    console.error(error instanceof Error ? error.message : error);
    process.exit(1);
  });
  const { handle, trusted } = started;

  http
    .createServer((req, res) => {
      if (answerProbe(req, res)) return;
      req.headers["x-forwarded-for"] = clientAddressOf(req.socket.remoteAddress, req.headers["x-forwarded-for"], trusted);
      delete req.headers["x-real-ip"];
      void handle(req, res);
    })
    .on("error", (error) => {
      console.error(`cannot serve on ${host}:${port}: ${error.message}`);
      process.exit(1);
    })
    .listen(port, host, () => {
      const proxies = trusted.size ? ` (trusted proxies: ${[...trusted].join(", ")})` : "";
      // With several processes the primary announces the address once all listen (above).
      if (cluster.isPrimary) console.log(`Emfolio on http://${host}:${port}${proxies}`);
      else if (proxies && cluster.worker?.id === 1) console.log(`web processes${proxies}`);
    });
}
