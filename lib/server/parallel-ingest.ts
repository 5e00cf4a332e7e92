/**
 * Parallel ingestion of a large capture file on two threads: the main thread sniffs the head with
 * the engine's layout detection and parses the first part of the body, a worker thread parses the
 * rest; both run the pure range parser of lib/analysis into shared arrays, which are then joined.
 * The result equals the single pass bit for bit; whenever a range meets anything but clean rows
 * (a rejection, an empty cell, a time stamp that does not increase...) this returns null and the
 * caller reads the file on the single pass, which then gives the exact result or rejection.
 */
import { createRequire } from "node:module";
import { fileURLToPath } from "node:url";
import { Worker } from "node:worker_threads";
import { ingestTraceEnabled } from "./env";
import {
  BODY_HEAD_BYTES,
  BodyRangeFallback,
  CaptureRejection,
  createBodyRangeParser,
  joinBodyRanges,
  prepareBodyLayout,
  type BodyRangeSummary,
  type ParsedCapture,
  type ParseOptions,
} from "@/lib/analysis";
import type { CaptureBytes } from "./capture-bytes";
import type { RangeJob, RangeReply } from "./parallel-ingest-worker";

/** Files at least this large go to two threads by default. */
export const PARALLEL_MIN_BYTES = 64 * 1024 ** 2;

export interface ParallelIngestOptions {
  /** "auto": two threads for files of PARALLEL_MIN_BYTES or more; "always": for any file over 1 MiB. */
  parallel?: "auto" | "always" | "never";
  /**
   * "always" waits for the worker and splits the remaining body in half (tests); otherwise the
   * split is made when the worker is up, and skipped once most of the file is read.
   */
  waitForWorker?: boolean;
  /** Told which path read the file, and why the two-thread path gave way when it did. */
  onPath?: (outcome: { path: "parallel" | "single"; reason?: string }) => void;
}

/** Read size of the single pass (capture-reader.ts): the range parsers see the same chunks. */
export const CHUNK_BYTES = BODY_HEAD_BYTES;
const PROBE_BYTES = 64 * 1024;
const DENSITY_PROBES = 16;
/** Past this share of the file a late worker is not worth a split. */
const LATEST_SPLIT = 0.7;

interface RangeWorker {
  readonly ready: boolean;
  whenReady: Promise<boolean>;
  run(job: RangeJob): Promise<RangeReply>;
  stop(): void;
}

/**
 * Worker threads do not inherit tsx's loader (Node 20: neither `tsx` nor `--import tsx` reaches
 * them), so the worker starts from a tiny evaluated script that registers tsx's CommonJS hook
 * (synchronous; about 100 ms less than its ESM hooks, which start a loader thread) and then
 * requires the TypeScript entry.
 */
function startRangeWorker(): RangeWorker {
  let worker: Worker;
  try {
    const tsxApi = createRequire(import.meta.url).resolve("tsx/cjs/api");
    const entry = fileURLToPath(new URL("./parallel-ingest-worker.ts", import.meta.url));
    worker = new Worker(`require(${JSON.stringify(tsxApi)}).register(); require(${JSON.stringify(entry)});`, { eval: true });
  } catch (error) {
    // No tsx (or no worker threads): a worker that never gets ready, so one thread reads it all.
    trace(`no worker: ${error instanceof Error ? error.message : String(error)}`);
    return { ready: false, whenReady: Promise.resolve(false), run: () => Promise.resolve({ kind: "fallback", reason: "no worker" }), stop: () => {} };
  }
  let ready = false;
  let settle: ((reply: RangeReply) => void) | null = null;
  let readyResolve: (value: boolean) => void = () => {};
  const whenReady = new Promise<boolean>((resolve) => (readyResolve = resolve));
  const fail = (reason: string): void => {
    readyResolve(false);
    settle?.({ kind: "fallback", reason });
    settle = null;
  };
  worker.on("message", (message: RangeReply | { kind: "ready" }) => {
    if (message.kind === "ready") {
      ready = true;
      readyResolve(true);
    } else {
      settle?.(message);
      settle = null;
    }
  });
  worker.on("error", (error) => fail(`worker error: ${error.message}`));
  worker.on("exit", () => fail("worker exited"));
  return {
    get ready() {
      return ready;
    },
    whenReady,
    run(job: RangeJob): Promise<RangeReply> {
      return new Promise<RangeReply>((resolve) => {
        settle = resolve;
        worker.postMessage(job);
      });
    },
    stop(): void {
      void worker.terminate();
    },
  };
}

/** EMFOLIO_INGEST_TRACE=1 prints the timeline to stderr (for the benchmark). */
function trace(message: string): void {
  if (ingestTraceEnabled()) console.error(`[ingest ${performance.now().toFixed(0)} ms] ${message}`);
}

const isDigit = (byte: number | undefined): boolean => byte !== undefined && byte >= 48 && byte <= 57;

/**
 * A line start at or after `target` whose previous line holds a digit: that line is either a row
 * (so the first range's last row number is the line count before the split) or a rejection.
 */
async function findSplit(bytes: CaptureBytes, target: number, size: number): Promise<number | null> {
  const before = 4096;
  const buffer = new Uint8Array(before + PROBE_BYTES);
  const from = Math.max(0, target - before);
  const got = await bytes.read(buffer, buffer.length, from);
  const window = buffer.subarray(0, got);
  for (let nl = window.indexOf(10, target - from); nl >= 0; nl = window.indexOf(10, nl + 1)) {
    const previous = window.lastIndexOf(10, nl - 1);
    if (previous < 0) continue;
    let digit = false;
    for (let i = previous + 1; i < nl && !digit; i++) digit = isDigit(window[i]);
    const split = from + nl + 1;
    if (digit && split < size) return split;
  }
  return null;
}

/** Newlines per byte in [from, to), from a few evenly spaced probes. */
async function lineDensity(source: CaptureBytes, from: number, to: number): Promise<number> {
  const buffer = new Uint8Array(PROBE_BYTES);
  let lines = 0;
  let bytes = 0;
  const span = to - from;
  for (let probe = 0; probe < DENSITY_PROBES; probe++) {
    const at = from + Math.floor((span * probe) / DENSITY_PROBES);
    const got = await source.read(buffer, Math.min(PROBE_BYTES, to - at), at);
    for (let i = buffer.indexOf(10); i >= 0 && i < got; i = buffer.indexOf(10, i + 1)) lines++;
    bytes += got;
  }
  return bytes > 0 ? lines / bytes : 0;
}

/**
 * Reads a capture's bytes on two threads; null when the single pass must read them instead.
 * Rejections the join itself finds (irregular time stamps) are thrown as the single pass would.
 * The caller opens and closes `bytes`.
 */
export async function readCaptureBytesParallel(
  bytes: CaptureBytes,
  options: ParseOptions,
  ingest: ParallelIngestOptions = {},
): Promise<ParsedCapture | null> {
  const giveWay = (reason: string): null => {
    ingest.onPath?.({ path: "single", reason });
    return null;
  };
  const { size } = bytes;
  if (options.engine === "reference") return giveWay("reference engine");
  if (size <= 2 * CHUNK_BYTES) return giveWay("small file");
  if (size > (options.maxBytes ?? 2 * 1024 ** 3)) return giveWay("oversize");
  const worker = startRangeWorker();
  trace("start");
  void worker.whenReady.then((ok) => trace(`worker ready: ${ok}`));
  try {
    const head = new Uint8Array(CHUNK_BYTES);
    if ((await bytes.read(head, CHUNK_BYTES, 0)) !== CHUNK_BYTES) return giveWay("short head");
    const prepared = prepareBodyLayout(head, options);
    const { range: layout } = prepared;
    const estimatedRows = (size - prepared.bodyOffset) / prepared.bytesPerRow;
    const capacity = Math.ceil(estimatedRows * 1.5) + 8192;
    const buffers = layout.headers.map((_, index) =>
      index === layout.timeColumn ? new SharedArrayBuffer(0) : new SharedArrayBuffer(capacity * Float64Array.BYTES_PER_ELEMENT),
    );
    const stores = buffers.map((buffer) => new Float64Array(buffer));
    const first = createBodyRangeParser(layout, prepared.firstLine, stores, 0, capacity);
    first.push(head.subarray(prepared.bodyOffset));

    if (ingest.waitForWorker) await worker.whenReady;
    let end = size;
    let second: Promise<RangeReply> | null = null;
    let base = 0;
    let position = CHUNK_BYTES;
    // Two buffers, as on the single pass: the next read is in flight while a chunk is parsed.
    let filling = new Uint8Array(CHUNK_BYTES);
    let spare = new Uint8Array(CHUNK_BYTES);
    let pending = bytes.read(filling, Math.min(CHUNK_BYTES, size - position), position);
    while (position < end) {
      if (!second && worker.ready && position < size * LATEST_SPLIT) {
        const split = await findSplit(bytes, position + Math.floor((size - position) / 2), size);
        if (split !== null) {
          const density = await lineDensity(bytes, position, split);
          base = first.rows + Math.ceil((split - position) * density * 1.03) + 1024;
          if (base < capacity) {
            first.setLimit(base);
            end = split;
            trace(`split at byte ${split} after reading ${position}`);
            second = worker.run({ path: bytes.path, availability: bytes.availability, start: split, end: size, chunkBytes: CHUNK_BYTES, layout, buffers, base, limit: capacity - base });
          }
        }
      }
      // A chunk read before the split is cut at it: chunk boundaries stay those of the single pass.
      const usable = Math.min(await pending, end - position);
      if (usable <= 0) break;
      const ready = filling;
      [filling, spare] = [spare, ready];
      const next = position + usable;
      if (next < end) pending = bytes.read(filling, Math.min(CHUNK_BYTES, end - next), next);
      first.push(ready.subarray(0, usable));
      position = next;
    }
    const summaries: BodyRangeSummary[] = [first.finish()];
    trace(`first range done: ${first.rows} rows`);
    if (second) {
      const reply = await second;
      trace(`second range: ${reply.kind === "done" ? `${reply.summary.count} rows` : reply.reason}`);
      if (reply.kind !== "done") return giveWay(reply.reason);
      const offset = summaries[0]?.lastLine ?? 0;
      if (offset === 0) return giveWay("no row before the split");
      const tail = reply.summary;
      const count = summaries[0]?.count ?? 0;
      if (count < base && tail.count > 0) {
        for (const store of stores) if (store.length > 0) store.copyWithin(count, base, base + tail.count);
      }
      summaries.push({
        ...tail,
        firstLine: tail.firstLine + offset,
        lastLine: tail.lastLine + offset,
        minStepLine: tail.minStepLine + offset,
        maxStepLine: tail.maxStepLine + offset,
      });
    }
    const channels = stores.filter((_, index) => index !== layout.timeColumn);
    const capture = joinBodyRanges(prepared, summaries, channels, options);
    ingest.onPath?.({ path: "parallel", ...(second ? {} : { reason: "worker not ready in time: one range" }) });
    return capture;
  } catch (error) {
    if (error instanceof BodyRangeFallback) return giveWay(error.reason);
    if (error instanceof CaptureRejection) ingest.onPath?.({ path: "parallel" });
    throw error;
  } finally {
    worker.stop();
  }
}
