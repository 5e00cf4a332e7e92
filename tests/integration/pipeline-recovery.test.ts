import { Redis } from "ioredis";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { getEnv } from "@/lib/server/env";
import { makeThreePhaseCsv } from "@/tests/fixtures/pipeline/make-capture";
import { closeConnections, demoLabStation, startWorker, uploadViaApi, waitForState } from "./pipeline-support";

let labId: string;
let token: string;
const run = Date.now() % 100_000;

beforeAll(async () => {
  ({ labId, token } = await demoLabStation());
});
afterAll(closeConnections);

describe("nothing lost: the database is the source of truth", () => {
  it("worker killed (SIGKILL) mid-job → the capture is analysed after a restart", async () => {
    // About 40 MB: a multipart upload, and long enough to analyse that the kill lands mid-job.
    const csv = makeThreePhaseCsv({ sampleRateHz: 100_000, cycles: 500, variant: run });
    const first = await startWorker();
    const { id, completeStatus } = await uploadViaApi(token, csv, { unitSerial: "KG45-260303" });
    expect(completeStatus).toBe(202);
    await waitForState(labId, id, ["analysing", "analysed"], 30_000);
    await first.kill();
    const afterKill = await waitForState(labId, id, ["analysing", "analysed", "queued"], 1_000);
    expect(afterKill.state, "the kill came too late to test a takeover").not.toBe("analysed");
    const second = await startWorker();
    try {
      const done = await waitForState(labId, id, ["analysed", "failed", "rejected"], 60_000);
      expect(done.state, `${done.stateMessage}\n${second.output()}`).toBe("analysed");
      expect(done.attempts).toBeGreaterThanOrEqual(2);
    } finally {
      await second.stop();
    }
  }, 120_000);

  it("Redis emptied of the queue while captures are queued → the start-up sweep re-enqueues them and they are analysed", async () => {
    const ids: string[] = [];
    for (const [i, serial] of ["KG45-260306", "KG45-260307"].entries()) {
      const { id } = await uploadViaApi(token, makeThreePhaseCsv({ variant: run + 10 + i }), { unitSerial: serial });
      ids.push(id);
    }
    // Every key of this queue prefix goes, as after a FLUSHDB, without touching other prefixes in the same db.
    const redis = new Redis(getEnv().REDIS_URL);
    let cursor = "0";
    do {
      const [next, keys] = await redis.scan(cursor, "MATCH", `${getEnv().QUEUE_PREFIX}:*`, "COUNT", 500);
      if (keys.length > 0) await redis.del(...keys);
      cursor = next;
    } while (cursor !== "0");
    expect(await redis.keys(`${getEnv().QUEUE_PREFIX}:*`)).toEqual([]);
    redis.disconnect();
    for (const id of ids) expect((await waitForState(labId, id, ["queued"], 1_000)).state).toBe("queued");
    const worker = await startWorker();
    try {
      for (const id of ids) expect((await waitForState(labId, id, ["analysed", "failed", "rejected"], 30_000)).state).toBe("analysed");
      expect(worker.output()).toMatch(/re-enqueued/);
    } finally {
      await worker.stop();
    }
  }, 90_000);
});
