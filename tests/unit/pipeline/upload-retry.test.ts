import { describe, expect, it } from "vitest";
import { isRetryable, MAX_TRIES, retryDelayMs, StoreAnswerError, withRetries } from "@/components/captures/upload-retry";

// The browser uploader's retry rule (common practice for HTTP clients: RFC 9110 §10.2.3 Retry-After
// in seconds or as an HTTP date; 429 and 5xx are worth another try, 4xx refusals are final).

const answer = (status: number, retryAfter: string | null = null) => new StoreAnswerError(status, null, retryAfter, `The object store answered ${status}`);

describe("upload retries", () => {
  it("isRetryable is true for no answer, 429 and 5xx, false for refusals such as 400 BadDigest and 403", () => {
    expect([0, 429, 500, 503].map((s) => isRetryable(answer(s)))).toEqual([true, true, true, true]);
    expect([400, 403, 404, 412].map((s) => isRetryable(answer(s)))).toEqual([false, false, false, false]);
    expect(isRetryable(new Error("cancelled"))).toBe(false);
  });

  it("retryDelayMs takes Retry-After in seconds or as an HTTP date, capped at 60 s, else backs off", () => {
    expect(retryDelayMs(answer(503, "3"), 1)).toBe(3000);
    expect(retryDelayMs(answer(503, "Wed, 02 Dec 2026 15:00:10 GMT"), 1, Date.parse("2026-12-02T15:00:00Z"))).toBe(10_000);
    expect(retryDelayMs(answer(429, "7200"), 1)).toBe(60_000);
    expect([1, 2, 3].map((n) => retryDelayMs(answer(0), n))).toEqual([1000, 2000, 4000]);
  });

  it("withRetries waits as Retry-After says, then succeeds", async () => {
    const waits: number[] = [];
    let calls = 0;
    const result = await withRetries("part 1", async () => {
      calls++;
      if (calls < 3) throw answer(503, "2");
      return "etag";
    }, undefined, async (ms) => { waits.push(ms); });
    expect([result, calls, waits]).toEqual(["etag", 3, [2000, 2000]]);
  });

  it("withRetries stops after MAX_TRIES with a message naming the upload and the last answer, and at once on a refusal", async () => {
    let calls = 0;
    await expect(withRetries("capture.csv", async () => { calls++; throw answer(503); }, undefined, async () => undefined))
      .rejects.toThrow(`capture.csv: the object store did not take it after ${MAX_TRIES} tries (last answer: The object store answered 503); try again later`);
    expect(calls).toBe(MAX_TRIES);
    calls = 0;
    await expect(withRetries("capture.csv", async () => { calls++; throw answer(400); }, undefined, async () => undefined)).rejects.toBeInstanceOf(StoreAnswerError);
    expect(calls).toBe(1);
  });
});
