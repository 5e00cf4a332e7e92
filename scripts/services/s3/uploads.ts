// Multipart uploads as s3rver keeps them on disk (<dir>/<bucket>/._S3rver_uploads/<uploadId>/key).
// s3rver takes a part for any upload id (it creates the folder) and answers 405 to an abort; the
// gate refuses parts for uploads that do not exist (completed, aborted, never begun) and aborts
// uploads itself, as S3 does.
import { existsSync, readFileSync, rmSync } from "node:fs";
import path from "node:path";
import { S3Failure } from "./errors";

const SAFE_ID = /^[A-Za-z0-9._-]{1,200}$/;

export type ObjectTarget = { bucket: string; key: string };

/** Bucket and key of a path-style object URL, or null for a bucket or service URL. */
export function objectTarget(pathname: string): ObjectTarget | null {
  const [bucket, ...rest] = pathname.split("/").filter((_, i) => i > 0);
  if (!bucket || rest.length === 0 || rest.join("/") === "") return null;
  try {
    return { bucket: decodeURIComponent(bucket), key: decodeURIComponent(rest.join("/")) };
  } catch {
    throw new S3Failure(400, "InvalidURI", "The object key is not valid percent-encoding");
  }
}

function uploadDir(dataDir: string, bucket: string, uploadId: string): string {
  if (!SAFE_ID.test(uploadId) || !SAFE_ID.test(bucket)) throw new S3Failure(404, "NoSuchUpload", "The specified upload does not exist");
  return path.join(dataDir, bucket, "._S3rver_uploads", uploadId);
}

/** Throws NoSuchUpload unless the upload is in progress for this very key. */
export function requireOpenUpload(dataDir: string, target: ObjectTarget, uploadId: string): void {
  const keyFile = path.join(uploadDir(dataDir, target.bucket, uploadId), "key");
  if (!existsSync(keyFile) || readFileSync(keyFile, "utf8") !== target.key) {
    throw new S3Failure(404, "NoSuchUpload", "The specified upload does not exist: it was completed or aborted, or never begun");
  }
}

/** AbortMultipartUpload: drops the upload's parts. */
export function abortUpload(dataDir: string, target: ObjectTarget, uploadId: string): void {
  requireOpenUpload(dataDir, target, uploadId);
  rmSync(uploadDir(dataDir, target.bucket, uploadId), { recursive: true, force: true });
}
