// Request bodies for the local object store's gate: spooled to a file while hashed and counted, so
// nothing reaches the store before the bytes are known to be the ones declared and signed.
import { createHash, randomBytes } from "node:crypto";
import { createWriteStream, mkdirSync, readdirSync, rmSync, statSync } from "node:fs";
import type { IncomingMessage } from "node:http";
import path from "node:path";
import { S3Failure } from "./errors";

export type Spooled = { file: string | null; bytes: number; sha256: Buffer; md5: Buffer };

const DISK_FULL_CODES = new Set(["ENOSPC", "EDQUOT", "EFBIG"]);

export function isDiskFull(err: unknown): boolean {
  return DISK_FULL_CODES.has((err as { code?: string } | null)?.code ?? "");
}

export function diskFull(detail: string): S3Failure {
  return new S3Failure(507, "InsufficientStorage", `The store's disk is full: ${detail}. Nothing was stored; free space or raise the quota, then send the file again`);
}

/** Bytes held under a folder (files only, recursively). */
export function folderBytes(dir: string): number {
  let total = 0;
  let entries: import("node:fs").Dirent[];
  try {
    entries = readdirSync(dir, { withFileTypes: true });
  } catch {
    return 0;
  }
  for (const entry of entries) {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) total += folderBytes(full);
    else if (entry.isFile()) {
      try {
        total += statSync(full).size;
      } catch {
        // removed meanwhile
      }
    }
  }
  return total;
}

/** Reads the whole body into a spool file (none for an empty body); hashes and counts it. */
export function spoolBody(req: IncomingMessage, spoolDir: string): Promise<Spooled> {
  mkdirSync(spoolDir, { recursive: true });
  const file = path.join(spoolDir, `${Date.now()}-${randomBytes(6).toString("hex")}.part`);
  const sha = createHash("sha256");
  const md5 = createHash("md5");
  let bytes = 0;
  return new Promise((resolve, reject) => {
    const out = createWriteStream(file);
    let failed = false;
    const fail = (err: unknown) => {
      if (failed) return;
      failed = true;
      out.destroy();
      req.resume();
      rmSync(file, { force: true });
      reject(isDiskFull(err) ? diskFull("the upload could not be buffered") : err);
    };
    req.on("data", (chunk: Buffer) => {
      bytes += chunk.length;
      sha.update(chunk);
      md5.update(chunk);
      if (!out.write(chunk)) req.pause();
    });
    out.on("drain", () => req.resume());
    out.on("error", fail);
    req.on("aborted", () => fail(new S3Failure(400, "IncompleteBody", "The request body ended before the declared Content-Length")));
    req.on("error", fail);
    req.on("end", () => {
      if (failed) return;
      out.end(() => {
        if (bytes === 0) rmSync(file, { force: true });
        resolve({ file: bytes === 0 ? null : file, bytes, sha256: sha.digest(), md5: md5.digest() });
      });
    });
  });
}

/** Refuses a body that is not the one declared: length, signed payload hash, checksum, MD5. */
export function checkBody(body: Spooled, headers: IncomingMessage["headers"], payloadSha256Hex: string | null): void {
  const declared = headers["content-length"];
  if (declared !== undefined && Number(declared) !== body.bytes) {
    throw new S3Failure(400, "IncompleteBody", `The body has ${body.bytes} bytes but Content-Length declared ${declared}`);
  }
  if (payloadSha256Hex && payloadSha256Hex !== body.sha256.toString("hex")) {
    throw new S3Failure(400, "XAmzContentSHA256Mismatch", "The body's SHA-256 differs from the signed x-amz-content-sha256");
  }
  const checksum = headers["x-amz-checksum-sha256"];
  if (typeof checksum === "string" && checksum !== body.sha256.toString("base64")) {
    throw new S3Failure(400, "BadDigest", "The SHA-256 checksum you specified did not match the bytes received: these are not the bytes this upload was issued for");
  }
  const md5 = headers["content-md5"];
  if (typeof md5 === "string" && md5 !== body.md5.toString("base64")) {
    throw new S3Failure(400, "BadDigest", "The Content-MD5 you specified did not match the bytes received");
  }
}
