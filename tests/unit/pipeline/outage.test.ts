import { describe, expect, it } from "vitest";
import { captureStateMessage, WORKER_SILENT_MESSAGE } from "@/lib/dal/captures";
import { asOutage, guessService, isConnectionFailure, outageSentence, ServiceOutage } from "@/lib/server/outage";
import { failureMessage, isOutageReason } from "@/worker/processors/messages";
import { MAX_DELAY_MS, rideDelayMs, rideOutages } from "@/worker/outage-ride";

const withCode = (message: string, code: string) => Object.assign(new Error(message), { code });
/** A failed query as drizzle wraps it: the SQL and its parameters in the message, the driver's error as cause. */
const wrapped = (cause: Error) => Object.assign(new Error('Failed query: update "captures" set "state" = $1\nparams: analysing'), { cause });

describe("isConnectionFailure", () => {
  it("isConnectionFailure() takes refused and dropped sockets, admin shutdown and timeouts as outages, through a cause chain", () => {
    for (const err of [
      withCode("connect ECONNREFUSED 127.0.0.1:5432", "ECONNREFUSED"),
      wrapped(withCode("read ECONNRESET", "ECONNRESET")),
      // SQLSTATEs from the PostgreSQL manual, appendix A.
      wrapped(withCode("terminating connection due to administrator command", "57P01")),
      withCode("the database system is starting up", "57P03"),
      withCode("connection failure", "08006"),
      wrapped(new Error("Connection terminated unexpectedly")),
      new Error("timeout exceeded when trying to connect"),
      Object.assign(new Error("Service Unavailable"), { $metadata: { httpStatusCode: 503 } }),
      Object.assign(new Error("socket hang up"), { name: "TimeoutError" }),
      new AggregateError([withCode("connect ECONNREFUSED ::1:6379", "ECONNREFUSED")], "all addresses failed"),
      new Error("Stream isn't writeable and enableOfflineQueue options is false"),
    ]) {
      expect(isConnectionFailure(err), String(err)).toBe(true);
    }
  });

  it("isConnectionFailure() leaves answers alone: a constraint, a raised exception, a 404, a 403, a plain bug", () => {
    for (const err of [
      wrapped(withCode('duplicate key value violates unique constraint "captures_pkey"', "23505")),
      wrapped(withCode("refused by a trigger", "P0001")),
      Object.assign(new Error("NoSuchKey"), { name: "NoSuchKey", $metadata: { httpStatusCode: 404 } }),
      Object.assign(new Error("AccessDenied"), { $metadata: { httpStatusCode: 403 } }),
      new TypeError("Cannot read properties of undefined"),
      "a string",
      null,
    ]) {
      expect(isConnectionFailure(err), String(err)).toBe(false);
    }
  });

  it("guessService() names the file store for SDK errors, the queue for ioredis ones and the database otherwise", () => {
    expect(guessService(Object.assign(new Error("x"), { code: "ECONNREFUSED", $metadata: {} }))).toBe("file store");
    expect(guessService(new Error("Connection is closed."))).toBe("queue");
    expect(guessService(wrapped(withCode("connect ECONNREFUSED", "ECONNREFUSED")))).toBe("database");
    expect(asOutage(new Error("no"), "database")).toBeNull();
    expect(asOutage(withCode("x", "ECONNREFUSED"), "file store")?.service).toBe("file store");
  });
});

describe("messages people read", () => {
  it("outageSentence() and failureMessage() are sentences without the driver's text", () => {
    expect(outageSentence("database", "analysis")).toBe("The database was unreachable; the analysis will be retried.");
    expect(outageSentence("file store", "later")).toBe("The file store was unreachable; please try again in a minute.");
    const driver = wrapped(withCode("connect ECONNREFUSED 127.0.0.1:54342", "ECONNREFUSED"));
    expect(failureMessage(new ServiceOutage("database", driver), 5, 5)).toBe("The database was unreachable; the analysis will be retried.");
    const genuine = failureMessage(driver, 2, 5);
    expect(genuine).toMatch(/attempt 2 of 5/);
    expect(genuine).not.toMatch(/ECONN|127\.0\.0\.1|:\d{4,5}|update|params/);
    expect(failureMessage(driver, 5, 5)).toMatch(/5 times.*re-run/);
    expect(isOutageReason(failureMessage(new ServiceOutage("file store", driver), 1, 5))).toBe(true);
    expect(isOutageReason(genuine)).toBe(false);
    expect(isOutageReason(undefined)).toBe(false);
  });

  it("captureStateMessage() says the worker stopped responding once an analysing row is older than the lock, not before", () => {
    const now = Date.parse("2026-12-02T12:00:00Z");
    const at = (msAgo: number) => new Date(now - msAgo);
    expect(captureStateMessage({ state: "analysing", stateMessage: null, updatedAt: at(30_001) }, 30_000, now)).toBe(WORKER_SILENT_MESSAGE);
    expect(captureStateMessage({ state: "analysing", stateMessage: null, updatedAt: at(29_000) }, 30_000, now)).toBeNull();
    expect(captureStateMessage({ state: "queued", stateMessage: "waiting", updatedAt: at(600_000) }, 30_000, now)).toBe("waiting");
  });
});

describe("rideOutages", () => {
  it("rideDelayMs() doubles from 0.5 s and stops at the cap", () => {
    expect([0, 1, 2, 3].map(rideDelayMs)).toEqual([500, 1000, 2000, 4000]);
    expect(rideDelayMs(10)).toBe(MAX_DELAY_MS);
    expect(MAX_DELAY_MS).toBe(5_000);
    expect(rideDelayMs(1000)).toBe(MAX_DELAY_MS);
  });

  it("rideOutages() retries a step through outages until it answers, and passes other errors straight on", async () => {
    let clock = 0;
    const waits: number[] = [];
    const options = { maxWaitMs: 60_000, now: () => clock, sleep: async (ms: number) => { waits.push(ms); clock += ms; }, log: () => undefined };
    let calls = 0;
    const value = await rideOutages("step", async () => {
      calls++;
      if (calls < 4) throw new ServiceOutage("database", new Error("down"));
      return 42;
    }, options);
    expect(value).toBe(42);
    expect(waits).toEqual([500, 1000, 2000]);
    await expect(rideOutages("step", () => Promise.reject(new Error("bug")), options)).rejects.toThrow("bug");
  });

  it("rideOutages() gives up with the outage once maxWaitMs has passed, never sleeping past it", async () => {
    let clock = 0;
    const waits: number[] = [];
    const options = { maxWaitMs: 25_000, now: () => clock, sleep: async (ms: number) => { waits.push(ms); clock += ms; }, log: () => undefined };
    await expect(rideOutages("step", () => Promise.reject(new ServiceOutage("file store", null)), options)).rejects.toBeInstanceOf(ServiceOutage);
    expect(waits.reduce((a, b) => a + b, 0)).toBe(25_000);
    expect(Math.max(...waits)).toBeLessThanOrEqual(MAX_DELAY_MS);
  });
});
