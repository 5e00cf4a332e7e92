import { createHash } from "node:crypto";
import { existsSync, readFileSync, writeFileSync, mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { readCaptureBytes, readCaptureFile } from "@/lib/server/capture-reader";
import { spoolObject, twoFrontOrder, type FetchRange } from "@/lib/server/object-spool";

const dir = mkdtempSync(path.join(tmpdir(), "object-spool-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

/** A 3-phase capture of about 6 MiB (deterministic), on disk and in memory. */
function captureFile(): { file: string; bytes: Buffer } {
  const lines = ["Time (s),V_AB (V),V_BC (V),V_CA (V)"];
  for (let n = 0; n < 160_000; n++) {
    const t = n / 20_000;
    lines.push([t.toFixed(6), ...[0, 1, 2].map((c) => (565.7 * Math.sin(2 * Math.PI * 50 * t - (c * 2 * Math.PI) / 3)).toFixed(4))].join(","));
  }
  const file = path.join(dir, "capture.csv");
  writeFileSync(file, lines.join("\n") + "\n");
  return { file, bytes: readFileSync(file) };
}
const { file, bytes } = captureFile();
const sha = createHash("sha256").update(bytes).digest("hex");

/** Serves ranges of `source` in small chunks after a short, uneven delay (as a store would). */
function memoryStore(source: Buffer, fault?: (start: number, calls: number) => Error | null): { fetch: FetchRange; ranges: [number, number][] } {
  const ranges: [number, number][] = [];
  let calls = 0;
  return {
    ranges,
    fetch: async (start, end) => {
      calls++;
      ranges.push([start, end]);
      const error = fault?.(start, calls) ?? null;
      await new Promise((r) => setTimeout(r, (start / 4096) % 7));
      if (error) throw error;
      const slice = source.subarray(start, end + 1);
      return (async function* () {
        for (let at = 0; at < slice.length; at += 64 * 1024) yield slice.subarray(at, at + 64 * 1024);
      })();
    },
  };
}

describe("twoFrontOrder", () => {
  it("alternates the start and the middle and visits every range once", () => {
    expect(twoFrontOrder(5)).toEqual([0, 3, 1, 4, 2]);
    expect(twoFrontOrder(4)).toEqual([0, 2, 1, 3]);
    expect(twoFrontOrder(1)).toEqual([0]);
    expect(twoFrontOrder(0)).toEqual([]);
    const order = twoFrontOrder(101);
    expect([...order].sort((a, b) => a - b)).toEqual(Array.from({ length: 101 }, (_, i) => i));
  });
});

describe("spoolObject", () => {
  it("fills a file equal to the object, hashes all of it, and removes it on close", async () => {
    const store = memoryStore(bytes);
    const spool = await spoolObject({ size: bytes.length, fetchRange: store.fetch, rangeBytes: 1 << 20, lanes: 3 });
    await spool.done();
    expect(await spool.sha256()).toBe(sha);
    expect(spool.progress()).toBe(1);
    expect(readFileSync(spool.path).equals(bytes)).toBe(true);
    // Every byte asked for once, in ranges that tile the object.
    const tiles = store.ranges.filter(([s, e]) => e - s + 1 === Math.min(1 << 20, bytes.length - s));
    expect(tiles.reduce((sum, [s, e]) => sum + (e - s + 1), 0)).toBe(bytes.length);
    await spool.close();
    expect(existsSync(path.dirname(spool.path))).toBe(false);
  });

  it("reads while it fills: the two-thread ingestion gives the same capture as the local file", async () => {
    const local = await readCaptureFile(file, {}, { parallel: "always", waitForWorker: true });
    const spool = await spoolObject({ size: bytes.length, fetchRange: memoryStore(bytes).fetch, rangeBytes: 1 << 20 });
    let used = "";
    try {
      const spooled = await readCaptureBytes(spool, {}, { parallel: "always", waitForWorker: true, onPath: (o) => (used = o.path) });
      expect(used).toBe("parallel");
      expect(spooled.sampleCount).toBe(local.sampleCount);
      expect(spooled.sampleRateHz).toBe(local.sampleRateHz);
      for (const [i, channel] of local.channels.entries()) expect(Array.from(spooled.channels[i]?.samples ?? [])).toEqual(Array.from(channel.samples));
      expect(await spool.sha256()).toBe(sha);
    } finally {
      await spool.close();
    }
  });

  it("retries a range the store failed once, then completes", async () => {
    const store = memoryStore(bytes, (start, calls) => (start === 1 << 20 && calls < 4 ? new Error("socket hang up") : null));
    const spool = await spoolObject({ size: bytes.length, fetchRange: store.fetch, rangeBytes: 1 << 20, attempts: 3 });
    try {
      expect(await spool.sha256()).toBe(sha);
      expect(store.ranges.filter(([s]) => s === 1 << 20).length).toBeGreaterThan(1);
    } finally {
      await spool.close();
    }
  });

  it("a store that keeps failing fails reads, the hash and the ingestion with the store's error", async () => {
    const down = Object.assign(new Error("connect ECONNREFUSED"), { code: "ECONNREFUSED" });
    const store = memoryStore(bytes, (start) => (start >= 3 << 20 ? down : null));
    const spool = await spoolObject({ size: bytes.length, fetchRange: store.fetch, rangeBytes: 1 << 20, attempts: 2 });
    try {
      await expect(spool.done()).rejects.toBe(down);
      await expect(spool.sha256()).rejects.toBe(down);
      await expect(readCaptureBytes(spool, {}, { parallel: "always", waitForWorker: true })).rejects.toBe(down);
    } finally {
      await spool.close();
    }
  });

  it("a final error (a changed object) is not retried", async () => {
    const changed = Object.assign(new Error("precondition"), { name: "PreconditionFailed" });
    const store = memoryStore(bytes, (start) => (start === 0 ? changed : null));
    const spool = await spoolObject({ size: bytes.length, fetchRange: store.fetch, rangeBytes: 1 << 20, attempts: 5, isFinal: (e) => e === changed });
    try {
      await expect(spool.done()).rejects.toBe(changed);
      expect(store.ranges.filter(([s, e]) => s === 0 && e === (1 << 20) - 1).length).toBe(1);
    } finally {
      await spool.close();
    }
  });
});
