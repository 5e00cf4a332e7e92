/**
 * Where the ingestion reads a capture's bytes from: a local file (the command-line tool, the
 * benchmark) or a local file that a download is still filling (the worker, object-spool.ts). Both
 * ingestions (capture-reader.ts, parallel-ingest.ts) read only through this, so the product and the
 * command-line tool run the same code.
 */
import { open, type FileHandle } from "node:fs/promises";

/**
 * Which byte ranges of a filling file are in place, for a thread that cannot await: one Int32 per
 * range of `rangeBytes` (0 pending, 1 written, 2 failed), woken with Atomics.notify.
 */
export interface ByteAvailability {
  states: SharedArrayBuffer;
  rangeBytes: number;
}

export const RANGE_PENDING = 0;
export const RANGE_WRITTEN = 1;
export const RANGE_FAILED = 2;

export interface CaptureBytes {
  /** A local file that holds (or is being filled with) the bytes. */
  readonly path: string;
  readonly size: number;
  /** Absent for a complete file; present while a download fills `path`. */
  readonly availability?: ByteAvailability;
  /** Reads up to `length` bytes at `position` into `buffer`, waiting for them if they are still on their way. */
  read(buffer: Uint8Array, length: number, position: number): Promise<number>;
  close(): Promise<void>;
}

/** Reads until `length` bytes or the end of the file. */
export async function readFully(handle: FileHandle, buffer: Uint8Array, length: number, position: number): Promise<number> {
  let got = 0;
  while (got < length) {
    const { bytesRead } = await handle.read(buffer, got, length - got, position + got);
    if (bytesRead === 0) break;
    got += bytesRead;
  }
  return got;
}

/** A complete file on local disk. */
export async function localFileBytes(path: string): Promise<CaptureBytes> {
  const handle = await open(path, "r");
  const { size } = await handle.stat();
  return {
    path,
    size,
    read: (buffer, length, position) => readFully(handle, buffer, Math.min(length, Math.max(0, size - position)), position),
    close: () => handle.close(),
  };
}

/**
 * Blocks the calling worker thread until every range covering [from, to) is written; false when
 * one of them failed (the thread then gives way and the main thread reports the download's error).
 */
export function waitForRanges(availability: ByteAvailability, from: number, to: number, timeoutMs = 10 * 60 * 1000): boolean {
  const states = new Int32Array(availability.states);
  const last = Math.min(states.length - 1, Math.floor((Math.max(from, to - 1)) / availability.rangeBytes));
  for (let index = Math.floor(from / availability.rangeBytes); index <= last; index++) {
    const deadline = Date.now() + timeoutMs;
    for (;;) {
      const state = Atomics.load(states, index);
      if (state === RANGE_WRITTEN) break;
      if (state === RANGE_FAILED || Date.now() > deadline) return false;
      Atomics.wait(states, index, RANGE_PENDING, 1000);
    }
  }
  return true;
}
