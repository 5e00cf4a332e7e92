import { open, stat } from "node:fs/promises";
import { createCaptureParser, type ParsedCapture, type ParseOptions } from "@/lib/analysis";
import { PARALLEL_MIN_BYTES, readCaptureFileParallel, type ParallelIngestOptions } from "./parallel-ingest";

export type { ParallelIngestOptions } from "./parallel-ingest";

/** Large reads keep the per-chunk overhead of the byte parser negligible. */
const FILE_CHUNK_BYTES = 1 << 20;

/**
 * Feeds a byte stream (a file stream, an S3 GetObject body, any async iterable of chunks) to the
 * streaming capture parser. Only the parser's typed arrays grow with the file; the text is never
 * held whole. Rejections from the parser (CaptureRejection) pass through unchanged.
 */
export async function readCapture(source: AsyncIterable<Uint8Array | string>, options: ParseOptions = {}): Promise<ParsedCapture> {
  const parser = createCaptureParser(options);
  const encoder = new TextEncoder();
  for await (const chunk of source) parser.push(typeof chunk === "string" ? encoder.encode(chunk) : chunk);
  return parser.finish();
}

/**
 * Reads a capture file from disk. Files of PARALLEL_MIN_BYTES or more are parsed on two threads
 * (parallel-ingest.ts), with the same result; anything that path does not take (a rejection, empty
 * cells, a worker that fails) is read again on the single pass below.
 */
export async function readCaptureFile(path: string, options: ParseOptions = {}, ingest: ParallelIngestOptions = {}): Promise<ParsedCapture> {
  const { size } = await stat(path);
  const mode = ingest.parallel ?? "auto";
  if (mode === "always" || (mode === "auto" && size >= PARALLEL_MIN_BYTES)) {
    const capture = await readCaptureFileParallel(path, size, options, ingest);
    if (capture) return capture;
  } else {
    ingest.onPath?.({ path: "single", reason: mode === "never" ? "parallel off" : "below the parallel threshold" });
  }
  return readCaptureFileSequential(path, size, options);
}

/**
 * The single pass: two reused buffers (no garbage per chunk), the next read in flight while the
 * parser works on the current chunk. The file's size sizes the sample arrays once.
 */
async function readCaptureFileSequential(path: string, size: number, options: ParseOptions): Promise<ParsedCapture> {
  const parser = createCaptureParser({ expectedBytes: size, ...options });
  const handle = await open(path, "r");
  try {
    let filling = new Uint8Array(FILE_CHUNK_BYTES);
    let spare = new Uint8Array(FILE_CHUNK_BYTES);
    let pending = handle.read(filling, 0, FILE_CHUNK_BYTES, null);
    for (;;) {
      const { bytesRead } = await pending;
      if (bytesRead === 0) break;
      const ready = filling;
      [filling, spare] = [spare, ready];
      pending = handle.read(filling, 0, FILE_CHUNK_BYTES, null);
      parser.push(ready.subarray(0, bytesRead));
    }
  } finally {
    await handle.close();
  }
  return parser.finish();
}
