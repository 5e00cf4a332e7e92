/**
 * The measuring half of `npm run bench -- --data-scale`: signs in as each role on a running app (the
 * scale database), then requests every target (targets.ts) with autocannon at each concurrency for a
 * bounded time, loopback only, and prints page, concurrency, p50, p95, p99, req/s, errors, bytes.
 *   tsx --import ./scripts/support/server-only-hook.mjs scripts/bench/data-scale/measure.ts \
 *     --base-url http://127.0.0.1:3122 [--duration 6] [--concurrency 10,50] [--only name,name]
 */
import autocannon from "autocannon";
import { closeDb } from "@/db/queries/connection";
import { DEMO_PASSWORD } from "@/db/seed-data";
import { createBenchKey } from "../bench-client";
import { printTable } from "../table";
import { ACCOUNTS, listTargets, type Target, type Who } from "./targets";

const argv = process.argv.slice(2);
const arg = (name: string, fallback: string) => (argv.includes(name) ? argv[argv.indexOf(name) + 1] ?? fallback : fallback);
const base = arg("--base-url", "http://127.0.0.1:3122");
if (!/^http:\/\/(127\.0\.0\.1|localhost)(:\d+)?$/.test(base)) throw new Error("the load goes to loopback only: --base-url http://127.0.0.1:PORT");
const duration = Number(arg("--duration", "6"));
const levels = arg("--concurrency", "10,50").split(",").map(Number);
const only = arg("--only", "").split(",").filter(Boolean);
const TARGET_P95_MS = 150;

function cookiesOf(res: Response): string[] {
  return res.headers.getSetCookie().map((c) => c.split(";")[0] ?? "").filter(Boolean);
}

/** next-auth's credentials sign-in, as a browser does it; returns the Cookie header of the session. */
async function signIn(email: string): Promise<string> {
  const csrf = await fetch(`${base}/api/auth/csrf`);
  const jar = cookiesOf(csrf);
  const { csrfToken } = (await csrf.json()) as { csrfToken: string };
  const res = await fetch(`${base}/api/auth/callback/credentials`, {
    method: "POST", redirect: "manual",
    headers: { "Content-Type": "application/x-www-form-urlencoded", Cookie: jar.join("; "), Origin: base },
    body: new URLSearchParams({ csrfToken, email, password: DEMO_PASSWORD, json: "true" }),
  });
  const all = [...jar, ...cookiesOf(res)];
  if (!all.some((c) => c.includes("session-token"))) throw new Error(`sign-in as ${email} gave no session (${res.status})`);
  return all.join("; ");
}

const ms = (v: number) => (Number.isFinite(v) ? v.toFixed(0) : `> ${duration * 1000}`);
const pct = (sorted: number[], p: number) => sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))] ?? Infinity;

async function measure(t: Target, headers: Record<string, string>, connections: number) {
  // One warm-up request, so a page's first compile or cold cache is not in the figures.
  await fetch(`${base}${t.path}`, { headers, redirect: "manual" }).then((r) => r.arrayBuffer());
  const times: number[] = [];
  let bytes = 0;
  let bad = 0;
  const result = await new Promise<autocannon.Result>((resolve, reject) => {
    const instance = autocannon({ url: `${base}${t.path}`, connections, duration, timeout: 20, headers }, (err, done) => (err ? reject(err) : resolve(done)));
    instance.on("response", (_client: unknown, status: number, resBytes: number, ms: number) => {
      times.push(ms);
      bytes += resBytes;
      if (status !== 200) bad++;
    });
  });
  times.sort((a, b) => a - b);
  const p95 = pct(times, 95);
  return {
    row: [t.name, String(connections), ms(pct(times, 50)), ms(p95), ms(pct(times, 99)), (times.length / duration).toFixed(1),
      String(bad + result.errors + result.timeouts), times.length > 0 ? (bytes / times.length / 1024).toFixed(1) : "—",
      connections === 10 ? (p95 < TARGET_P95_MS ? "met" : "MISSED") : ""],
    p95,
  };
}

try {
  const targets = (await listTargets()).filter((t) => only.length === 0 || only.includes(t.name));
  const auth: Partial<Record<Who, Record<string, string>>> = {};
  for (const who of new Set(targets.map((t) => t.who))) {
    if (who === "station") auth.station = { Authorization: `Bearer ${(await createBenchKey("data-scale benchmark")).token}` };
    else auth[who] = { Cookie: await signIn(ACCOUNTS[who]) };
  }
  const rows = [["page", "conc.", "p50 ms", "p95 ms", "p99 ms", "req/s", "errors", "KiB/resp", `p95 < ${TARGET_P95_MS} ms`]];
  for (const connections of levels) {
    for (const t of targets) {
      const { row } = await measure(t, auth[t.who] ?? {}, connections);
      rows.push(row);
      console.error(row.join("  "));
    }
  }
  printTable(`Data scale: ${duration} s per page and concurrency, signed-in, loopback (app, PostgreSQL and load on the same 2 cores)`, rows);
} finally {
  await closeDb();
}
