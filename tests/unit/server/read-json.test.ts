import { describe, expect, it } from "vitest";
import { z } from "zod";
import { HttpError } from "@/lib/auth/guards";
import { readBounded, readJson } from "@/lib/dal/request";

const schema = z.object({ serial: z.string().min(1) });
const post = (body: BodyInit, headers: Record<string, string> = { "content-type": "application/json" }) =>
  new Request("http://test/api", { method: "POST", headers, body, duplex: "half" } as RequestInit);

async function refusal(run: () => Promise<unknown>): Promise<{ status: number; message: string }> {
  try {
    await run();
  } catch (err) {
    if (err instanceof HttpError) return { status: err.status, message: err.message };
    throw err;
  }
  throw new Error("expected a refusal");
}

/** A body that never ends unless the reader stops: counts what was pulled from it. */
function endless(): { stream: ReadableStream<Uint8Array>; pulled: () => number } {
  let pulled = 0;
  const chunk = new Uint8Array(16 * 1024).fill(32);
  const stream = new ReadableStream<Uint8Array>({ pull: (c) => { pulled += chunk.byteLength; c.enqueue(chunk); } });
  return { stream, pulled: () => pulled };
}

describe("readJson", () => {
  it("parses a JSON body with the schema", async () => {
    expect(await readJson(post(JSON.stringify({ serial: "KG45-1" })), schema)).toEqual({ serial: "KG45-1" });
  });

  it("refuses another content type with 415, bad JSON with 400, and names the failing field", async () => {
    expect((await refusal(() => readJson(post("serial=x", { "content-type": "application/x-www-form-urlencoded" }), schema))).status).toBe(415);
    expect(await refusal(() => readJson(post("{nope"), schema))).toEqual({ status: 400, message: "The request body is not valid JSON" });
    expect(await refusal(() => readJson(post(JSON.stringify({ serial: 4 })), schema))).toMatchObject({ status: 400, message: expect.stringContaining("serial") });
  });

  it("refuses a declared length over 64 KiB with 413 before reading", async () => {
    const { stream, pulled } = endless();
    const req = post(stream, { "content-type": "application/json", "content-length": String(10 * 1024 ** 3) });
    expect((await refusal(() => readJson(req, schema))).status).toBe(413);
    expect(pulled()).toBeLessThanOrEqual(64 * 1024);
  });

  it("cuts an undeclared endless body at the limit with 413 (it does not buffer it)", async () => {
    const { stream, pulled } = endless();
    expect((await refusal(() => readJson(post(stream), schema))).status).toBe(413);
    expect(pulled()).toBeLessThan(256 * 1024);
  });
});

describe("readBounded", () => {
  it("returns text exactly at the limit and refuses one byte more", async () => {
    expect(await readBounded(post("x".repeat(1024)), 1024)).toHaveLength(1024);
    expect((await refusal(() => readBounded(post("x".repeat(1025)), 1024))).status).toBe(413);
  });

  it("refuses bytes that are not UTF-8 with 400", async () => {
    expect((await refusal(() => readBounded(post(new Uint8Array([0x7b, 0xff, 0xfe, 0x7d])), 1024))).status).toBe(400);
  });
});
