import { CaptureRejection } from "./rejection";

export type CaptureEncoding = "utf-8" | "utf-16le" | "utf-16be";

/** The encoding a byte-order mark names (UTF-8 without one). Needs the first two bytes. */
export function encodingOf(first: Uint8Array): CaptureEncoding {
  if (first[0] === 0xff && first[1] === 0xfe) return "utf-16le";
  if (first[0] === 0xfe && first[1] === 0xff) return "utf-16be";
  return "utf-8";
}

/** Text of the first bytes of a capture, in the encoding its byte-order mark names. */
export function decodeHead(head: Uint8Array): string {
  return new TextDecoder(encodingOf(head)).decode(head);
}

/**
 * Streams UTF-16 (with its byte-order mark) into UTF-8 bytes, chunk by chunk, so the byte-level
 * parsers read it like any other capture. Nothing but the odd trailing byte is carried over.
 */
export function createUtf8Transcoder(encoding: "utf-16le" | "utf-16be"): { push(chunk: Uint8Array): Uint8Array; finish(): Uint8Array } {
  const decoder = new TextDecoder(encoding);
  const encoder = new TextEncoder();
  return {
    push: (chunk) => encoder.encode(decoder.decode(chunk, { stream: true })),
    finish: () => encoder.encode(decoder.decode()),
  };
}

/** NUL bytes on one parity only, beside ASCII: UTF-16 text saved without a byte-order mark. */
function looksLikeUtf16(head: Uint8Array): "LE" | "BE" | null {
  const n = Math.min(head.length, 4096) & ~1;
  if (n < 8) return null;
  let evenNul = 0;
  let oddNul = 0;
  for (let i = 0; i < n; i += 2) {
    if (head[i] === 0) evenNul++;
    if (head[i + 1] === 0) oddNul++;
  }
  const pairs = n / 2;
  if (oddNul > 0.4 * pairs && evenNul < 0.05 * pairs) return "LE";
  if (evenNul > 0.4 * pairs && oddNul < 0.05 * pairs) return "BE";
  return null;
}

function lineAt(bytes: Uint8Array, offset: number): number {
  let line = 1;
  for (let i = 0; i < offset; i++) if (bytes[i] === 10) line++;
  return line;
}

/** Refuses binary data in the (UTF-8) head, naming UTF-16 without a byte-order mark as such. */
export function checkTextHead(head: Uint8Array): void {
  if (encodingOf(head) !== "utf-8") return;
  const utf16 = looksLikeUtf16(head);
  if (utf16) {
    throw new CaptureRejection(
      "utf16-no-bom",
      `The file is UTF-16 (${utf16}) text without a byte-order mark: save it as UTF-8, or as UTF-16 with a byte-order mark`,
      { line: 1 },
    );
  }
  let control = 0;
  for (let i = 0; i < head.length; i++) {
    const byte = head[i] as number;
    if (byte === 0) throw new CaptureRejection("binary", "The file holds binary data (a NUL byte), not CSV text", { line: lineAt(head, i) });
    if (byte < 32 && byte !== 9 && byte !== 10 && byte !== 13) control++;
  }
  if (control > Math.max(8, head.length / 100)) {
    throw new CaptureRejection("binary", "The file holds binary data (control bytes), not CSV text", { line: 1 });
  }
}
