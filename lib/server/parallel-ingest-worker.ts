/**
 * Worker thread of parallel-ingest.ts: parses one byte range of a capture file's body into the
 * shared sample arrays. Loaded through tsx's ESM API (see parallel-ingest.ts), so it imports the
 * pure engine by relative path.
 */
import { closeSync, openSync, readSync } from "node:fs";
import { parentPort } from "node:worker_threads";
import { BodyRangeFallback, createBodyRangeParser, type BodyRangeLayout } from "../analysis/body-range";
import { waitForRanges, type ByteAvailability } from "./capture-bytes";

export interface RangeJob {
  path: string;
  /** Present while a download still fills `path`: each read waits for its bytes. */
  availability?: ByteAvailability;
  start: number;
  end: number;
  /** Chunk boundaries of the single pass: multiples of this from the file's start. */
  chunkBytes: number;
  layout: BodyRangeLayout;
  /** One per column (the time column's is empty), each over a SharedArrayBuffer. */
  buffers: SharedArrayBuffer[];
  base: number;
  limit: number;
}

export type RangeReply =
  | { kind: "done"; summary: ReturnType<ReturnType<typeof createBodyRangeParser>["finish"]> }
  | { kind: "fallback"; reason: string };

function runJob(job: RangeJob): RangeReply {
  const stores = job.buffers.map((buffer) => new Float64Array(buffer));
  const parser = createBodyRangeParser(job.layout, 1, stores, job.base, job.limit);
  const fd = openSync(job.path, "r");
  try {
    const buffer = new Uint8Array(job.chunkBytes);
    let position = job.start;
    while (position < job.end) {
      const chunkEnd = Math.min(job.end, (Math.floor(position / job.chunkBytes) + 1) * job.chunkBytes);
      const wanted = chunkEnd - position;
      if (job.availability && !waitForRanges(job.availability, position, chunkEnd)) return { kind: "fallback", reason: "download failed" };
      let got = 0;
      while (got < wanted) {
        const bytesRead = readSync(fd, buffer, got, wanted - got, position + got);
        if (bytesRead === 0) break;
        got += bytesRead;
      }
      if (got === 0) break;
      parser.push(buffer.subarray(0, got));
      position += got;
    }
    return { kind: "done", summary: parser.finish() };
  } catch (error) {
    if (error instanceof BodyRangeFallback) return { kind: "fallback", reason: error.reason };
    return { kind: "fallback", reason: `error: ${error instanceof Error ? error.message : String(error)}` };
  } finally {
    closeSync(fd);
  }
}

const port = parentPort;
if (port) {
  port.on("message", (job: RangeJob) => {
    port.postMessage(runJob(job));
    port.close();
  });
  port.postMessage({ kind: "ready" });
}
