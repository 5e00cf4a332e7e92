import { sniffLines } from "./sniff";
import { checkTextHead, decodeHead } from "./text-encoding";
import type { ChannelRole } from "./types";

export interface SniffedHeader {
  delimiter: string;
  decimal: "." | ",";
  headers: string[];
  metadata: Record<string, string>;
  suggestedRoles: Record<string, ChannelRole>;
  /** The column read as time (or as a sample index), when there is one. */
  timeColumn: string | null;
  timeIsIndex: boolean;
  /** From the preamble or header region; null when the file states none. */
  statedSampleRateHz: number | null;
}

/**
 * For the upload form and the intake check: reads the first lines of a capture (as text) and
 * reports the dialect, headers, preamble metadata, time column and suggested roles. Pure and
 * browser-safe.
 */
export function sniffCaptureHeader(firstBytes: string): SniffedHeader {
  const text = firstBytes.replace(/^\uFEFF/, "");
  const lines = text.split(/\r?\n/);
  if (lines.length > 1 && !/\n$/.test(text)) lines.pop();
  const layout = sniffLines(lines);
  return {
    delimiter: layout.delimiter,
    decimal: layout.decimal,
    headers: layout.headers,
    metadata: layout.metadata,
    suggestedRoles: layout.suggestedRoles,
    timeColumn: layout.timeColumn !== null ? (layout.headers[layout.timeColumn] ?? null) : null,
    timeIsIndex: layout.timeIsIndex,
    statedSampleRateHz: layout.preambleSampleRateHz,
  };
}

/** The same from raw bytes: a byte-order mark picks UTF-8 or UTF-16; binary data is refused. */
export function sniffCaptureBytes(head: Uint8Array): SniffedHeader {
  checkTextHead(head);
  return sniffCaptureHeader(decodeHead(head));
}
