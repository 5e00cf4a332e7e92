import { createCaptureParser, type ParsedCapture, type ParseOptions } from "@/lib/analysis";
import { localFileBytes, type CaptureBytes } from "./capture-bytes";
import { PARALLEL_MIN_BYTES, readCaptureBytesParallel, type ParallelIngestOptions } from "./parallel-ingest";

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

/** Reads a capture file from disk (the command-line tool and the benchmark): see readCaptureBytes. */
export async function readCaptureFile(path: string, options: ParseOptions = {}, ingest: ParallelIngestOptions = {}): Promise<ParsedCapture> {
  const bytes = await localFileBytes(path);
  try {
    return await readCaptureBytes(bytes, options, ingest);
  } finally {
    await bytes.close();
  }
}

/**
 * Reads a capture's bytes (a local file, or one a download is filling: the worker). Captures of
 * PARALLEL_MIN_BYTES or more are parsed on two threads (parallel-ingest.ts), with the same result;
 * anything that path does not take (a rejection, empty cells, a worker that fails) is read again on
 * the single pass below. The caller closes `bytes`.
 */
export async function readCaptureBytes(bytes: CaptureBytes, options: ParseOptions = {}, ingest: ParallelIngestOptions = {}): Promise<ParsedCapture> {
  const mode = ingest.parallel ?? "auto";
  if (mode === "always" || (mode === "auto" && bytes.size >= PARALLEL_MIN_BYTES)) {
    const capture = await readCaptureBytesParallel(bytes, options, ingest);
    if (capture) return capture;
  } else {
    ingest.onPath?.({ path: "single", reason: mode === "never" ? "parallel off" : "below the parallel threshold" });
  }
  return readCaptureBytesSequential(bytes, options);
}

/**
 * The single pass: two reused buffers (no garbage per chunk), the next read in flight while the
 * parser works on the current chunk. The size sizes the sample arrays once.
 */
async function readCaptureBytesSequential(bytes: CaptureBytes, options: ParseOptions): Promise<ParsedCapture> {
  const parser = createCaptureParser({ expectedBytes: bytes.size, ...options });
  let filling = new Uint8Array(FILE_CHUNK_BYTES);
  let spare = new Uint8Array(FILE_CHUNK_BYTES);
  let position = 0;
  let pending = bytes.read(filling, FILE_CHUNK_BYTES, position);
  for (;;) {
    const bytesRead = await pending;
    if (bytesRead === 0) break;
    const ready = filling;
    [filling, spare] = [spare, ready];
    position += bytesRead;
    pending = bytes.read(filling, FILE_CHUNK_BYTES, position);
    parser.push(ready.subarray(0, bytesRead));
  }
  return parser.finish();
}
