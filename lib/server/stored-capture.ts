/**
 * Reads a stored capture for the worker and hashes every byte of it. Objects of PARALLEL_MIN_BYTES
 * or more come down with parallel ranged GETs (object-spool.ts) into the same two-thread ingestion
 * the command-line tool uses on a local file (capture-reader.ts); smaller ones stream through the
 * single pass. Either way the sha256 is of the whole object, and the caller compares it with the
 * one registered at upload before it trusts the parse.
 */
import { createHash } from "node:crypto";
import { createCaptureParser, type ParsedCapture, type ParseOptions } from "@/lib/analysis";
import { readCaptureBytes } from "./capture-reader";
import { spoolObject } from "./object-spool";
import { PARALLEL_MIN_BYTES } from "./parallel-ingest";
import { headObject, isPreconditionFailed, openObjectStream } from "./storage";

export interface StoredObject {
  objectKey: string;
  objectEtag: string | null;
  sizeBytes: number;
}

export interface StoredRead {
  /** Null when the parse refused the bytes (`parseError` says why). */
  parsed: ParsedCapture | null;
  parseError: unknown;
  sha256: string;
  bytes: number;
  path: "ranged" | "stream";
}

const PROGRESS_EVERY_MS = 250;

export async function readStoredCapture(object: StoredObject, options: ParseOptions, onProgress: (share: number) => void): Promise<StoredRead> {
  const etag = object.objectEtag ?? undefined;
  if (object.sizeBytes < PARALLEL_MIN_BYTES) return streamStoredCapture(object, options, onProgress);
  // Ranges are cut from the registered size: a stored object of another size is a mismatch, said
  // before any range is asked for.
  const stored = await headObject(object.objectKey);
  if (!stored || stored.sizeBytes !== object.sizeBytes) {
    return { parsed: null, parseError: null, sha256: "", bytes: stored?.sizeBytes ?? 0, path: "ranged" };
  }
  const spool = await spoolObject({
    size: object.sizeBytes,
    fetchRange: (start, end, signal) => openObjectStream(object.objectKey, { etag, range: { start, end }, signal }),
    isFinal: isPreconditionFailed,
  });
  const ticker = setInterval(() => onProgress(spool.progress()), PROGRESS_EVERY_MS);
  try {
    let parsed: ParsedCapture | null = null;
    let parseError: unknown = null;
    try {
      parsed = await readCaptureBytes(spool, options);
    } catch (error) {
      parseError = error;
    }
    // A download error (the store went away, the object changed) outranks what the parser made of a
    // partial file; the hash is of the whole object, so it waits for every byte.
    const sha256 = await spool.sha256();
    onProgress(1);
    return { parsed, parseError, sha256, bytes: object.sizeBytes, path: "ranged" };
  } finally {
    clearInterval(ticker);
    await spool.close();
  }
}

/** The single pass over one GET stream: hashed and parsed as bytes arrive. */
async function streamStoredCapture(object: StoredObject, options: ParseOptions, onProgress: (share: number) => void): Promise<StoredRead> {
  const parser = createCaptureParser(options);
  const hash = createHash("sha256");
  let read = 0;
  const stream = await openObjectStream(object.objectKey, { etag: object.objectEtag ?? undefined });
  for await (const chunk of stream as AsyncIterable<Uint8Array>) {
    hash.update(chunk);
    parser.push(chunk);
    read += chunk.length;
    onProgress(read / Math.max(1, object.sizeBytes));
  }
  // The sizes and hash are compared before the parse's verdict on the whole file is trusted.
  let parsed: ParsedCapture | null = null;
  let parseError: unknown = null;
  try {
    parsed = parser.finish();
  } catch (error) {
    parseError = error;
  }
  return { parsed, parseError, sha256: hash.digest("hex"), bytes: read, path: "stream" };
}
