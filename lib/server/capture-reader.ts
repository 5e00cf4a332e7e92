import { open, stat } from "node:fs/promises";
import { createCaptureParser, type ParsedCapture, type ParseOptions } from "@/lib/analysis";

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
 * Reads a capture file from disk through one reused buffer (no garbage per chunk); the file's
 * size sizes the sample arrays once.
 */
export async function readCaptureFile(path: string, options: ParseOptions = {}): Promise<ParsedCapture> {
  const { size } = await stat(path);
  const parser = createCaptureParser({ expectedBytes: size, ...options });
  const handle = await open(path, "r");
  try {
    const buffer = new Uint8Array(FILE_CHUNK_BYTES);
    for (;;) {
      const { bytesRead } = await handle.read(buffer, 0, buffer.length, null);
      if (bytesRead === 0) break;
      parser.push(buffer.subarray(0, bytesRead));
    }
  } finally {
    await handle.close();
  }
  return parser.finish();
}
