import { CaptureRejection } from "./rejection";

/** Most columns a capture may have; more is a table written the wrong way round, or not a capture. */
export const MAX_COLUMNS = 1024;

export interface HeadLines {
  lines: string[];
  starts: number[];
}

/** The first `maxLines` complete lines of the head (all of them once the input has ended). */
export function splitHead(head: Uint8Array, final: boolean, maxLines: number): HeadLines {
  const decoder = new TextDecoder();
  const lines: string[] = [];
  const starts: number[] = [];
  let start = 0;
  while (lines.length < maxLines) {
    const newline = head.indexOf(10, start);
    if (newline < 0) break;
    starts.push(start);
    lines.push(decoder.decode(head.subarray(start, newline)).replace(/\r$/, ""));
    start = newline + 1;
  }
  if (final && start < head.length && lines.length < maxLines) {
    starts.push(start);
    lines.push(decoder.decode(head.subarray(start)).replace(/\r$/, ""));
  }
  if (lines[0] !== undefined) lines[0] = lines[0].replace(/^\uFEFF/, "");
  return { lines, starts };
}

/**
 * Refuses heads that are not one sample row per line, naming the cause: CR-only line ends, a line
 * with no end in the whole head, more than MAX_COLUMNS fields on a line.
 */
export function checkHeadShape(head: Uint8Array, final: boolean, headLimit: number): void {
  let line = 1;
  const counts = [0, 0, 0];
  let sawNewline = false;
  let sawCr = false;
  for (let i = 0; i < head.length; i++) {
    const byte = head[i];
    if (byte === 10) {
      sawNewline = true;
      line++;
      counts.fill(0);
    } else if (byte === 44 || byte === 59 || byte === 9) {
      const slot = byte === 44 ? 0 : byte === 59 ? 1 : 2;
      const fields = (counts[slot] = (counts[slot] as number) + 1) + 1;
      if (fields > MAX_COLUMNS) {
        throw new CaptureRejection(
          "too-many-columns",
          `More than ${MAX_COLUMNS} columns on one line: a capture has one column per channel and one row per sample (a table written sideways?)`,
          { line },
        );
      }
    } else if (byte === 13) {
      sawCr = true;
    }
  }
  if (sawNewline) return;
  if (sawCr) {
    throw new CaptureRejection("cr-line-ends", "Lines end in a carriage return only (CR, no line feed): save the file with LF or CR LF line ends", { line: 1 });
  }
  if (!final && head.length >= headLimit) {
    throw new CaptureRejection(
      "line-too-long",
      `Line 1 has no line end in its first ${Math.round(headLimit / 1024)} KiB: a capture has one sample row per line`,
      { line: 1 },
    );
  }
}
