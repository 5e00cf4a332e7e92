import { sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getDb } from "@/db/client";
import { getEnv } from "@/lib/server/env";
import { startTcpProxy, type TcpProxy } from "@/tests/support/tcp-proxy";
import { makeThreePhaseCsv } from "@/tests/fixtures/pipeline/make-capture";
import { closeConnections, demoLabStation, startWorker, uploadViaApi, waitForState } from "./pipeline-support";

// Outages of the worker's services: the worker reaches PostgreSQL and the object store through
// relays this file cuts and restores; the test itself (and the "web" it plays) reaches them directly.

let labId: string;
let token: string;
const run = Date.now() % 100_000;
const proxies: TcpProxy[] = [];
const portOf = (url: string) => Number(new URL(url).port);
/** What must never reach a page or the API: SQL, driver text, addresses, stacks. */
const INTERNAL = /select |insert |update |delete |params:|failed query|ECONN|127\.0\.0\.1|localhost|:\d{2,5}\b|\bat \S+\.(ts|js)/i;

beforeAll(async () => {
  ({ labId, token } = await demoLabStation());
});
afterAll(async () => {
  for (const p of proxies) await p.close();
  await getDb().execute(sql`drop trigger if exists emfolio_test_refuse_analysis on analyses`);
  await getDb().execute(sql`drop function if exists emfolio_test_refuse_analysis()`);
  await closeConnections();
});

async function proxied(url: string): Promise<{ proxy: TcpProxy; url: string }> {
  const proxy = await startTcpProxy(portOf(url));
  proxies.push(proxy);
  return { proxy, url: proxy.url(url) };
}

// Earlier files leave captures queued with no worker of their own; this file's worker (and its sweep)
// takes them first, so the waits below allow for that backlog on a loaded machine.
describe("worker outages: the capture waits, then is analysed, without spending an attempt", () => {
  it("runAnalysis with PostgreSQL unreachable for 6 s → the job rides it out and the capture ends analysed on its first attempt", async () => {
    const db = await proxied(getEnv().DATABASE_URL);
    const worker = await startWorker({ DATABASE_URL: db.url });
    try {
      await db.proxy.cut();
      const { id, completeStatus } = await uploadViaApi(token, makeThreePhaseCsv({ variant: run + 1 }), { unitSerial: "KG45-260306" });
      expect(completeStatus).toBe(202);
      await new Promise((r) => setTimeout(r, 6_000));
      expect((await waitForState(labId, id, ["queued"], 1_000)).state).toBe("queued");
      await db.proxy.restore();
      const done = await waitForState(labId, id, ["analysed", "failed", "rejected"], 150_000);
      expect(done.state, `${done.stateMessage}\n${worker.output()}`).toBe("analysed");
      // One claim: the outage spent no attempt (a spent one would have claimed it again).
      expect(done.attempts).toBe(1);
      expect(worker.output()).not.toMatch(/failed \(attempt/);
      expect(worker.output()).toMatch(/database unreachable/);
    } finally {
      await db.proxy.restore().catch(() => undefined);
      await worker.stop();
    }
  }, 300_000);

  it("runAnalysis with the object store unreachable → the page says so in a sentence, and the capture is analysed once it is back", async () => {
    const s3 = await proxied(getEnv().S3_ENDPOINT);
    const worker = await startWorker({ S3_ENDPOINT: s3.url });
    try {
      await s3.proxy.cut();
      const { id } = await uploadViaApi(token, makeThreePhaseCsv({ variant: run + 2 }), { unitSerial: "KG45-260307" });
      const until = Date.now() + 90_000;
      let waiting = await waitForState(labId, id, ["queued", "analysing"], 1_000);
      while (!waiting.stateMessage && Date.now() < until) {
        await new Promise((r) => setTimeout(r, 200));
        waiting = await waitForState(labId, id, ["queued", "analysing"], 1_000);
      }
      expect(waiting.stateMessage).toBe("The file store was unreachable; the analysis will be retried.");
      await s3.proxy.restore();
      const done = await waitForState(labId, id, ["analysed", "failed", "rejected"], 150_000);
      expect(done.state, `${done.stateMessage}\n${worker.output()}`).toBe("analysed");
      expect(done.stateMessage).toBeNull();
      expect(done.attempts).toBe(1);
      expect(worker.output()).not.toMatch(/failed \(attempt/);
    } finally {
      await s3.proxy.restore().catch(() => undefined);
      await worker.stop();
    }
  }, 300_000);

  it("a database error that is not an outage is retried as a genuine failure, its stateMessage a sentence: no SQL, host, port or stack", async () => {
    // The forced error: PostgreSQL refuses to store this run's analyses (a genuine error, not a lost connection).
    await getDb().execute(sql.raw(`create or replace function emfolio_test_refuse_analysis() returns trigger language plpgsql as $$
      begin raise exception 'refused by the test at 127.0.0.1:5432 for %', new.capture_id; end $$`));
    await getDb().execute(sql`drop trigger if exists emfolio_test_refuse_analysis on analyses`);
    await getDb().execute(sql`create trigger emfolio_test_refuse_analysis before insert on analyses for each row execute function emfolio_test_refuse_analysis()`);
    const worker = await startWorker();
    try {
      const { id } = await uploadViaApi(token, makeThreePhaseCsv({ variant: run + 3 }), { unitSerial: "KG45-260306" });
      const until = Date.now() + 30_000;
      let row = await waitForState(labId, id, ["queued", "analysing", "failed"], 1_000);
      while (!(row.attempts >= 1 && row.state === "queued" && row.stateMessage) && Date.now() < until) {
        await new Promise((r) => setTimeout(r, 100));
        row = await waitForState(labId, id, ["queued", "analysing", "failed"], 1_000);
      }
      expect(row.stateMessage).toMatch(/internal error \(attempt 1 of \d+/);
      expect(row.stateMessage).not.toMatch(INTERNAL);
      // The details are in the log, for the lab manager.
      expect(worker.output()).toMatch(/refused by the test/);
      await getDb().execute(sql`drop trigger if exists emfolio_test_refuse_analysis on analyses`);
      const done = await waitForState(labId, id, ["analysed", "failed", "rejected"], 40_000);
      expect(done.state).toBe("analysed");
      expect(done.attempts).toBeGreaterThanOrEqual(2);
    } finally {
      await getDb().execute(sql`drop trigger if exists emfolio_test_refuse_analysis on analyses`);
      await worker.stop();
    }
  }, 300_000);
});
