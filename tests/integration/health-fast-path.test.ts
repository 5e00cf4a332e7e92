import { createServer, type Server } from "node:http";
import type { AddressInfo } from "node:net";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET as legacy } from "@/app/api/health/route";
import { GET as live } from "@/app/api/health/live/route";
import { GET as ready } from "@/app/api/health/ready/route";
import { HEALTH_HEADERS } from "@/lib/server/health";
import { answerProbe } from "@/lib/server/health-probe";
import { SITE_HEADERS } from "@/lib/server/site-headers.mjs";
import { closeConnections } from "./pipeline-support";

// scripts/serve.ts answers the probe paths with answerProbe before Next; here the same function
// behind a plain Node server, against the real services, compared with the route handlers.

let server: Server;
let base: string;
let fellThrough: string[] = [];

beforeAll(async () => {
  server = createServer((req, res) => {
    if (answerProbe(req, res)) return;
    fellThrough.push(`${req.method} ${req.url}`);
    res.writeHead(418).end();
  });
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
  base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
});
afterAll(async () => {
  await new Promise((resolve) => server.close(resolve));
  await closeConnections();
});

describe("answerProbe (the probes in scripts/serve.ts)", () => {
  it("answerProbe answers GET /api/health/live like the route handler: 200 { ok: true }, not cached", async () => {
    const res = await fetch(`${base}/api/health/live?from=lb`);
    const route = live();
    expect(res.status).toBe(route.status);
    expect(await res.json()).toEqual(await route.json());
    expect(res.headers.get("cache-control")).toBe("no-store");
    expect(res.headers.get("content-type")).toBe("application/json");
  });

  it("answerProbe answers /api/health/ready and /api/health with the route handlers' cached check", async () => {
    const viaRoute = (await (await ready()).json()) as { ready: boolean; checkedAt: string };
    const res = await fetch(`${base}/api/health/ready`);
    const body = (await res.json()) as { ready: boolean; checkedAt: string; services: Record<string, string> };
    expect(res.status).toBe(200);
    expect(body.ready).toBe(true);
    // One measurement shared by both doors within the cache's few seconds.
    expect(body.checkedAt).toBe(viaRoute.checkedAt);
    expect(JSON.stringify(body)).not.toMatch(/127\.0\.0\.1|:\d{4,5}|postgres:\/\//);
    const older = await fetch(`${base}/api/health`);
    expect(await older.json()).toEqual(await (await legacy()).json());
  });

  it("answerProbe's answers carry exactly the site's security headers, the probe's own and nothing else", async () => {
    // What Node's http server adds to any answer on its own.
    const transport = new Set(["date", "connection", "keep-alive", "transfer-encoding"]);
    const lower = (headers: Record<string, string>) => Object.fromEntries(Object.entries(headers).map(([k, v]) => [k.toLowerCase(), v]));
    for (const method of ["GET", "HEAD"]) {
      for (const path of ["/api/health/live", "/api/health/ready", "/api/health"]) {
        const res = await fetch(`${base}${path}`, { method });
        const sent = Object.fromEntries([...res.headers].filter(([key]) => !transport.has(key)));
        const { "content-length": length, ...rest } = sent;
        expect(rest, `${method} ${path}`).toEqual({ ...lower(SITE_HEADERS), ...lower(HEALTH_HEADERS), "content-type": "application/json" });
        expect(Number(length), `${method} ${path}`).toBeGreaterThan(0);
      }
    }
    // OWASP Secure Headers Project's recommendations against framing and sniffing (common practice).
    expect(SITE_HEADERS["X-Frame-Options"]).toBe("DENY");
    expect(SITE_HEADERS["Content-Security-Policy"]).toContain("frame-ancestors 'none'");
    expect(SITE_HEADERS["X-Content-Type-Options"]).toBe("nosniff");
  });

  it("answerProbe answers HEAD without a body and leaves other methods and paths to Next", async () => {
    const head = await fetch(`${base}/api/health/live`, { method: "HEAD" });
    expect(head.status).toBe(200);
    expect(await head.text()).toBe("");
    fellThrough = [];
    for (const [method, path] of [["POST", "/api/health/live"], ["GET", "/api/health/live/x"], ["GET", "/api/healthz"], ["GET", "/sign-in"]] as const) {
      expect((await fetch(`${base}${path}`, { method })).status).toBe(418);
    }
    expect(fellThrough).toEqual(["POST /api/health/live", "GET /api/health/live/x", "GET /api/healthz", "GET /sign-in"]);
  });
});
