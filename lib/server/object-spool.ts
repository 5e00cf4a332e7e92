/**
 * A large stored object brought to local disk with parallel ranged GETs, readable while it fills:
 * the two-thread ingestion reads it through CaptureBytes (each read waits for its bytes; a short
 * probe of bytes not yet in place is fetched on its own), and a hashing thread computes the sha256
 * over the whole object in order as ranges land. Ranges are fetched from two fronts (the start and
 * the middle), where the two ingestion threads begin. The file is sparse, in its own temporary
 * folder, removed on close.
 */
import { mkdtemp, open, rm, type FileHandle } from "node:fs/promises";
import { tmpdir } from "node:os";
import path from "node:path";
import { Worker } from "node:worker_threads";
import { RANGE_FAILED, RANGE_WRITTEN, readFully, type CaptureBytes } from "./capture-bytes";

export type FetchRange = (start: number, end: number, signal: AbortSignal) => Promise<AsyncIterable<Uint8Array>>;

export interface SpoolOptions {
  size: number;
  /** Bytes [start, end] (inclusive) of the object. */
  fetchRange: FetchRange;
  lanes?: number;
  rangeBytes?: number;
  /** Folder for the temporary file (the system's temporary folder by default). */
  dir?: string;
  /** Attempts per range before the download fails (a store that answers again within them is ridden out here). */
  attempts?: number;
  /** Errors that retrying cannot mend (a changed object): they fail the download at once. */
  isFinal?: (error: unknown) => boolean;
}

export interface SpooledObject extends CaptureBytes {
  /** The sha256 (hex) of the whole object; rejects with the download's error when it failed. */
  sha256(): Promise<string>;
  /** Resolves when every byte is in place; rejects with the download's error. */
  done(): Promise<void>;
  /** Share of the object in place, 0–1. */
  progress(): number;
}

export const SPOOL_LANES = 4;
export const SPOOL_RANGE_BYTES = 8 * 1024 ** 2;
/** Reads this short of bytes not yet in place are fetched directly (the ingestion's probes). */
const DIRECT_READ_BYTES = 256 * 1024;

/** Range indices from two fronts: 0, h, 1, h+1, … (h = the middle range). */
export function twoFrontOrder(count: number): number[] {
  const half = Math.ceil(count / 2);
  const order: number[] = [];
  for (let i = 0; i < half; i++) {
    order.push(i);
    if (half + i < count) order.push(half + i);
  }
  return order;
}

// Plain JavaScript with built-ins only, so the thread starts without a TypeScript loader.
const HASHER = `
const { parentPort, workerData } = require("node:worker_threads");
const { openSync, readSync, closeSync } = require("node:fs");
const { createHash } = require("node:crypto");
(() => {
  const { file, size, states, rangeBytes } = workerData;
  const flags = new Int32Array(states);
  const hash = createHash("sha256");
  const buffer = Buffer.allocUnsafe(rangeBytes);
  const fd = openSync(file, "r");
  try {
    for (let i = 0; i < flags.length; i++) {
      for (;;) {
        const state = Atomics.load(flags, i);
        if (state === ${RANGE_WRITTEN}) break;
        if (state === ${RANGE_FAILED}) return parentPort.postMessage({ failed: true });
        Atomics.wait(flags, i, 0, 1000);
      }
      const start = i * rangeBytes;
      const length = Math.min(rangeBytes, size - start);
      let got = 0;
      while (got < length) {
        const n = readSync(fd, buffer, got, length - got, start + got);
        if (n === 0) break;
        got += n;
      }
      hash.update(buffer.subarray(0, got));
    }
    parentPort.postMessage({ sha256: hash.digest("hex") });
  } finally {
    closeSync(fd);
  }
})();
`;

type Waiter = { resolve: () => void; reject: (error: unknown) => void };

/** Gathers a range's chunks in the lane's buffer, then writes it with one call (64 KiB writes cost more than the copy). */
async function writeStream(handle: FileHandle, body: AsyncIterable<Uint8Array>, position: number, scratch: Uint8Array): Promise<number> {
  let filled = 0;
  let total = 0;
  const flush = async (): Promise<void> => {
    let done = 0;
    while (done < filled) done += (await handle.write(scratch, done, filled - done, position + total - filled + done)).bytesWritten;
    filled = 0;
  };
  for await (const chunk of body) {
    let at = 0;
    while (at < chunk.length) {
      const take = Math.min(chunk.length - at, scratch.length - filled);
      scratch.set(chunk.subarray(at, at + take), filled);
      filled += take;
      total += take;
      at += take;
      if (filled === scratch.length) await flush();
    }
  }
  await flush();
  return total;
}

async function collect(body: AsyncIterable<Uint8Array>, into: Uint8Array): Promise<number> {
  let got = 0;
  for await (const chunk of body) {
    const take = Math.min(chunk.length, into.length - got);
    into.set(chunk.subarray(0, take), got);
    got += take;
  }
  return got;
}

export async function spoolObject(options: SpoolOptions): Promise<SpooledObject> {
  const { size, fetchRange } = options;
  const rangeBytes = options.rangeBytes ?? SPOOL_RANGE_BYTES;
  const attempts = options.attempts ?? 3;
  const folder = await mkdtemp(path.join(options.dir ?? tmpdir(), "emfolio-spool-"));
  const file = path.join(folder, "object");
  let handle: FileHandle;
  try {
    handle = await open(file, "w+");
    await handle.truncate(size);
  } catch (error) {
    await rm(folder, { recursive: true, force: true });
    throw error;
  }
  const count = Math.ceil(size / rangeBytes);
  const states = new SharedArrayBuffer(4 * count);
  const flags = new Int32Array(states);
  const waiters = new Map<number, Waiter[]>();
  const aborter = new AbortController();
  let failure: unknown = null;
  let written = 0;
  let closed = false;

  const fail = (error: unknown): void => {
    if (failure !== null) return;
    failure = error;
    for (let i = 0; i < count; i++) if (Atomics.load(flags, i) !== RANGE_WRITTEN) Atomics.store(flags, i, RANGE_FAILED);
    for (let i = 0; i < count; i++) Atomics.notify(flags, i);
    for (const list of waiters.values()) for (const w of list) w.reject(error);
    waiters.clear();
    aborter.abort();
  };

  const fetchInto = async (index: number, scratch: Uint8Array): Promise<void> => {
    const start = index * rangeBytes;
    const end = Math.min(size, start + rangeBytes) - 1;
    for (let attempt = 1; ; attempt++) {
      try {
        const got = await writeStream(handle, await fetchRange(start, end, aborter.signal), start, scratch);
        if (got !== end + 1 - start) throw new Error(`the store sent ${got} bytes for range ${start}-${end}`);
        return;
      } catch (error) {
        if (closed || failure !== null || attempt >= attempts || options.isFinal?.(error)) throw error;
        await new Promise((resolve) => setTimeout(resolve, 250 * 2 ** attempt));
      }
    }
  };

  const order = twoFrontOrder(count);
  let next = 0;
  const lanes = Array.from({ length: Math.min(options.lanes ?? SPOOL_LANES, Math.max(1, count)) }, async () => {
    const scratch = new Uint8Array(Math.min(rangeBytes, Math.max(1, size)));
    while (failure === null && !closed && next < order.length) {
      const index = order[next++] as number;
      await fetchInto(index, scratch);
      written += Math.min(rangeBytes, size - index * rangeBytes);
      Atomics.store(flags, index, RANGE_WRITTEN);
      Atomics.notify(flags, index);
      for (const w of waiters.get(index) ?? []) w.resolve();
      waiters.delete(index);
    }
  });
  const finished = Promise.all(lanes).then(() => {
    if (failure !== null) throw failure;
  }, (error: unknown) => {
    fail(error);
    throw error;
  });
  finished.catch(() => undefined);

  const hasher = new Worker(HASHER, { eval: true, workerData: { file, size, states, rangeBytes } });
  const digest = new Promise<string>((resolve, reject) => {
    hasher.once("message", (message: { sha256?: string; failed?: boolean }) => {
      if (message.sha256) resolve(message.sha256);
      else finished.then(() => reject(new Error("the hashing thread stopped")), reject);
    });
    hasher.once("error", reject);
    hasher.once("exit", () => reject(new Error("the hashing thread exited")));
  });
  digest.catch(() => undefined);

  const whenWritten = (index: number): Promise<void> => {
    if (Atomics.load(flags, index) === RANGE_WRITTEN) return Promise.resolve();
    if (failure !== null) return Promise.reject(failure);
    return new Promise((resolve, reject) => waiters.set(index, [...(waiters.get(index) ?? []), { resolve, reject }]));
  };

  return {
    path: file,
    size,
    availability: { states, rangeBytes },
    async read(buffer, length, position) {
      const want = Math.min(length, Math.max(0, size - position));
      if (want === 0) return 0;
      const first = Math.floor(position / rangeBytes);
      const last = Math.floor((position + want - 1) / rangeBytes);
      let inPlace = true;
      for (let i = first; i <= last && inPlace; i++) inPlace = Atomics.load(flags, i) === RANGE_WRITTEN;
      if (!inPlace && failure === null && want <= DIRECT_READ_BYTES) {
        return collect(await fetchRange(position, position + want - 1, aborter.signal), buffer.subarray(0, want));
      }
      for (let i = first; i <= last; i++) await whenWritten(i);
      return readFully(handle, buffer, want, position);
    },
    sha256: () => digest,
    done: () => finished,
    progress: () => (size === 0 ? 1 : written / size),
    async close() {
      if (closed) return;
      closed = true;
      aborter.abort();
      await Promise.allSettled(lanes);
      await hasher.terminate();
      await handle.close();
      await rm(folder, { recursive: true, force: true });
    },
  };
}
