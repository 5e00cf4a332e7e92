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
  cluster.on("exit", (worker, code, signal) => {
    if (stopping) return;
    console.error(`web process ${worker.process.pid} ended (${signal ?? code}); starting another`);
    cluster.fork();
  });
  for (const signal of ["SIGTERM", "SIGINT"] as const) {
    process.on(signal, () => {
      stopping = true;
      for (const worker of Object.values(cluster.workers ?? {})) worker?.process.kill("SIGTERM");
      process.exit(0);
    });
  }
} else {
  const app = next({ dev: false, hostname: host, port });
  await app.prepare();
  const handle = app.getRequestHandler();
  // After prepare(): Next has loaded .env files by then, as `next start` does.
  const trusted = parseTrustedProxies(getEnv().TRUSTED_PROXIES);

  http
    .createServer((req, res) => {
      if (answerProbe(req, res)) return;
      req.headers["x-forwarded-for"] = clientAddressOf(req.socket.remoteAddress, req.headers["x-forwarded-for"], trusted);
      delete req.headers["x-real-ip"];
      void handle(req, res);
    })
    .listen(port, host, () => {
      if (cluster.isPrimary || cluster.worker?.id === 1) {
        console.log(`Emfolio on http://${host}:${port}${processes > 1 ? ` (${processes} processes)` : ""}${trusted.size ? ` (trusted proxies: ${[...trusted].join(", ")})` : ""}`);
      }
    });
}
