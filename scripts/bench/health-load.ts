/**
 * The health section of `npm run bench`: /api/health/live and /api/health/ready of a running app
 * under 50 concurrent keep-alive connections for 10 s each (autocannon; bounded, loopback only).
 * Reports requests per second and latency percentiles against the 500 requests/s target.
 *   node --import tsx scripts/bench/health-load.ts --base-url http://127.0.0.1:3150
 */
import autocannon from "autocannon";
import { printTable } from "./table";

const TARGET_RPS = 500;
const argv = process.argv.slice(2);
const base = argv[argv.indexOf("--base-url") + 1] ?? "http://127.0.0.1:3150";
if (!/^http:\/\/(127\.0\.0\.1|localhost)(:\d+)?$/.test(base)) throw new Error("the load goes to loopback only: --base-url http://127.0.0.1:PORT");

async function measure(path: string) {
  const result = await autocannon({ url: `${base}${path}`, connections: 50, duration: 10, timeout: 10 });
  return [path, result.requests.average.toFixed(0), String(result.latency.p50), String(result.latency.p99), String(result.errors + result.timeouts + result.non2xx),
    `${(result.requests.average / TARGET_RPS).toFixed(2)}× (${result.requests.average >= TARGET_RPS ? "met" : "missed"} ≥ ${TARGET_RPS}/s)`];
}

const rows = [["route", "req/s", "p50 ms", "p99 ms", "errors", "vs target"]];
for (const path of ["/api/health/live", "/api/health/ready"]) rows.push(await measure(path));
printTable("Health probes, 50 concurrent connections, 10 s each (web app, services and load on the same 2 cores)", rows);
