import { inArray } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { getDb } from "@/db/client";
import { countAnalysisBacklog } from "@/db/queries/captures";
import { captureInstruments, captures } from "@/db/schema";
import { GET as live } from "@/app/api/health/live/route";
import { POST as registerRoute } from "@/app/api/v1/captures/route";
import { GET as ready } from "@/app/api/health/ready/route";
import { BACKLOG_RETRY_AFTER_S, resetBacklogCount } from "@/lib/dal/backpressure";
import { makeThreePhaseCsv } from "@/tests/fixtures/pipeline/make-capture";
import { closeConnections, demoLabStation, registerViaApi, sha256, uploadViaApi } from "./pipeline-support";

// A small backlog limit for this file only (each test file has its own parsed environment).
const LIMIT = vi.hoisted(() => {
  vi.stubEnv("ANALYSIS_BACKLOG_LIMIT", "3");
  return 3;
});

let token: string;
const run = Date.now() % 1_000_000;
const made: string[] = [];

beforeAll(async () => {
  ({ token } = await demoLabStation());
});
afterAll(async () => {
  // Queued captures of this file only; no worker ran, so none has an analysis.
  if (made.length > 0) {
    await getDb().delete(captureInstruments).where(inArray(captureInstruments.captureId, made));
    await getDb().delete(captures).where(inArray(captures.id, made));
  }
  await closeConnections();
});

describe("backpressure on the bench API", () => {
  it("POST /api/v1/captures answers 429 with Retry-After once more than ANALYSIS_BACKLOG_LIMIT captures wait, and 201 below it", async () => {
    resetBacklogCount();
    const waiting = await countAnalysisBacklog(LIMIT + 1);
    if (waiting <= LIMIT) {
      const below = await registerViaApi(token, makeThreePhaseCsv({ variant: run }), { unitSerial: "KG45-260310" });
      expect(below.status).toBe(201);
      if (below.body.capture) made.push(below.body.capture.id);
    }
    for (let i = 0; (await countAnalysisBacklog(LIMIT + 1)) <= LIMIT; i++) {
      const { id, completeStatus } = await uploadViaApi(token, makeThreePhaseCsv({ variant: run + 1 + i }), { unitSerial: "KG45-260310" });
      expect(completeStatus).toBe(202);
      made.push(id);
    }
    resetBacklogCount();
    const csv = makeThreePhaseCsv({ variant: run + 50 });
    const full = await registerRoute(new Request("http://test/api/v1/captures", {
      method: "POST", headers: { Authorization: `Bearer ${token}`, "Content-Type": "application/json" },
      body: JSON.stringify({ unitSerial: "KG45-260310", testKind: "no-load", fileName: "full.csv", sizeBytes: Buffer.byteLength(csv), sha256: sha256(csv) }),
    }));
    expect(full.status).toBe(429);
    expect(full.headers.get("Retry-After")).toBe(String(BACKLOG_RETRY_AFTER_S));
    expect(((await full.json()) as { error: string }).error).toMatch(/More than 3 captures are waiting/);
  });
});

describe("health probes", () => {
  it("GET /api/health/live answers 200 without touching a service", async () => {
    const res = live();
    expect(res.status).toBe(200);
    expect(await res.json()).toEqual({ ok: true });
  });

  it("GET /api/health/ready reports each service by name and state only, and shares one check between calls a moment apart", async () => {
    const first = await ready();
    const body = (await first.json()) as { ready: boolean; checkedAt: string; services: Record<string, string> };
    expect(first.status).toBe(200);
    expect(body.ready).toBe(true);
    expect(Object.keys(body.services).sort()).toEqual(["attachments", "database", "file store", "mail", "queue"]);
    for (const service of ["database", "queue", "file store"]) expect(body.services[service]).toBe("up");
    expect(JSON.stringify(body)).not.toMatch(/127\.0\.0\.1|:\d{4,5}|postgres:\/\//);
    const second = (await (await ready()).json()) as { checkedAt: string };
    expect(second.checkedAt).toBe(body.checkedAt);
  });
});
