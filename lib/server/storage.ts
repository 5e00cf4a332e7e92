import {
  AbortMultipartUploadCommand, CompleteMultipartUploadCommand, CreateMultipartUploadCommand, DeleteObjectCommand, GetObjectCommand, HeadObjectCommand,
  PutObjectCommand, S3Client, UploadPartCommand,
} from "@aws-sdk/client-s3";
import { getSignedUrl } from "@aws-sdk/s3-request-presigner";
import type { Readable } from "node:stream";
import { getEnv } from "./env";

// Object storage for raw captures. Raw objects are immutable: written once through a presigned
// upload, then only read (by the worker, and by authorised downloads).

/** Parts of a multipart upload (S3 allows 5 MiB to 5 GiB per part, at most 10 000 parts). */
export const MULTIPART_THRESHOLD_BYTES = 32 * 1024 ** 2;
const MIN_PART_BYTES = 16 * 1024 ** 2;
const MAX_PARTS = 10_000;
/** Presigned upload and download URLs stay valid this long. */
export const UPLOAD_URL_TTL_S = 60 * 60;
const DOWNLOAD_URL_TTL_S = 5 * 60;

const globalForS3 = globalThis as unknown as { emfolioS3?: S3Client; emfolioPublicS3?: S3Client };

function buildClient(endpoint: string): S3Client {
  const env = getEnv();
  return new S3Client({
    endpoint,
    region: env.S3_REGION,
    forcePathStyle: env.S3_FORCE_PATH_STYLE === "true",
    credentials: { accessKeyId: env.S3_ACCESS_KEY_ID, secretAccessKey: env.S3_SECRET_ACCESS_KEY },
    // Without these the SDK sends aws-chunked bodies that some S3-compatible stores keep verbatim.
    requestChecksumCalculation: "WHEN_REQUIRED",
    responseChecksumValidation: "WHEN_REQUIRED",
  });
}

/** The one S3 client for server-side calls. */
export function getS3(): S3Client {
  globalForS3.emfolioS3 ??= buildClient(getEnv().S3_ENDPOINT);
  return globalForS3.emfolioS3;
}

/** Signs URLs with the address browsers and bench PCs reach, when it differs from the internal one. */
function getPublicS3(): S3Client {
  const env = getEnv();
  if (!env.S3_PUBLIC_ENDPOINT) return getS3();
  globalForS3.emfolioPublicS3 ??= buildClient(env.S3_PUBLIC_ENDPOINT);
  return globalForS3.emfolioPublicS3;
}

export function captureObjectKey(labId: string, unitId: string, captureId: string): string {
  return `captures/${labId}/${unitId}/${captureId}.csv`;
}

export function partSizeFor(sizeBytes: number): number {
  return Math.max(MIN_PART_BYTES, Math.ceil(sizeBytes / MAX_PARTS / 1024 ** 2) * 1024 ** 2);
}

export function partCountFor(sizeBytes: number): number {
  return Math.max(1, Math.ceil(sizeBytes / partSizeFor(sizeBytes)));
}

/** The base64 form of a hex sha256, as x-amz-checksum-sha256 carries it. */
export function sha256Base64(hex: string): string {
  return Buffer.from(hex, "hex").toString("base64");
}

// Headers the client must send exactly as signed (kept out of the query string, so the store
// compares them with the bytes it receives).
const BOUND_HEADERS = new Set(["x-amz-checksum-sha256", "content-length", "if-none-match"]);

/**
 * A single PUT bound to the key, the exact length and the registered sha256 (the store refuses other
 * bytes), and only while nothing is stored under the key (If-None-Match: *), so once the upload is
 * in, the URL can no longer replace it. Returns the URL and the headers the client must send.
 */
export async function presignSinglePut(key: string, sizeBytes: number, sha256Hex: string): Promise<{ url: string; headers: Record<string, string> }> {
  const checksum = sha256Base64(sha256Hex);
  const command = new PutObjectCommand({
    Bucket: getEnv().S3_BUCKET, Key: key, ContentLength: sizeBytes, ContentType: "text/csv", ChecksumSHA256: checksum, IfNoneMatch: "*",
  });
  const url = await getSignedUrl(getPublicS3(), command, { expiresIn: UPLOAD_URL_TTL_S, unhoistableHeaders: BOUND_HEADERS });
  return { url, headers: { "Content-Type": "text/csv", "x-amz-checksum-sha256": checksum, "If-None-Match": "*" } };
}

/** Multipart uploads carry a SHA-256 per part, which the store checks on each part and at completion. */
export async function createMultipartUpload(key: string): Promise<string> {
  const out = await getS3().send(new CreateMultipartUploadCommand({ Bucket: getEnv().S3_BUCKET, Key: key, ContentType: "text/csv", ChecksumAlgorithm: "SHA256" }));
  if (!out.UploadId) throw new Error("The object store returned no multipart upload id");
  return out.UploadId;
}

export type PartToSign = { partNumber: number; sizeBytes: number; sha256Base64: string };

/** Part URLs bound to each part's length and the SHA-256 the client computed for it. */
export async function presignParts(key: string, uploadId: string, parts: readonly PartToSign[]): Promise<{ partNumber: number; url: string; headers: Record<string, string> }[]> {
  const bucket = getEnv().S3_BUCKET;
  return Promise.all(
    parts.map(async (part) => {
      const command = new UploadPartCommand({
        Bucket: bucket, Key: key, UploadId: uploadId, PartNumber: part.partNumber, ContentLength: part.sizeBytes, ChecksumSHA256: part.sha256Base64,
      });
      const url = await getSignedUrl(getPublicS3(), command, { expiresIn: UPLOAD_URL_TTL_S, unhoistableHeaders: BOUND_HEADERS });
      return { partNumber: part.partNumber, url, headers: { "x-amz-checksum-sha256": part.sha256Base64 } };
    }),
  );
}

/** Assembles the parts; refused when an object is already stored under the key (If-None-Match: *). */
export async function completeMultipartUpload(key: string, uploadId: string, parts: readonly { partNumber: number; etag: string; sha256?: string }[]): Promise<void> {
  await getS3().send(
    new CompleteMultipartUploadCommand({
      Bucket: getEnv().S3_BUCKET, Key: key, UploadId: uploadId, IfNoneMatch: "*",
      MultipartUpload: {
        Parts: [...parts].sort((a, b) => a.partNumber - b.partNumber).map((p) => ({ PartNumber: p.partNumber, ETag: p.etag, ...(p.sha256 ? { ChecksumSHA256: p.sha256 } : {}) })),
      },
    }),
  );
}

/** Size and ETag of a stored object, or null when nothing is stored under the key. */
export async function headObject(key: string): Promise<{ sizeBytes: number; etag: string } | null> {
  try {
    const out = await getS3().send(new HeadObjectCommand({ Bucket: getEnv().S3_BUCKET, Key: key }));
    return { sizeBytes: out.ContentLength ?? 0, etag: out.ETag ?? "" };
  } catch (err) {
    if (isNotFound(err)) return null;
    throw err;
  }
}

/** What a GET of an object may ask for: `range` is bytes [start, end] (inclusive). */
export type ObjectRead = { etag?: string; range?: { start: number; end: number }; signal?: AbortSignal };

/** The one GET of a stored object; with `etag`, fails with a 412 when the object changed since the upload was completed. */
async function getObjectBody(key: string, { etag, range, signal }: ObjectRead) {
  const out = await getS3().send(
    new GetObjectCommand({ Bucket: getEnv().S3_BUCKET, Key: key, IfMatch: etag || undefined, Range: range && `bytes=${range.start}-${range.end}` }),
    signal ? { abortSignal: signal } : {},
  );
  return out.Body;
}

/** The first bytes of an object, for a header check before queueing. */
export async function readObjectHead(key: string, bytes: number): Promise<Uint8Array> {
  const body = await getObjectBody(key, { range: { start: 0, end: bytes - 1 } });
  return body ? body.transformToByteArray() : new Uint8Array(0);
}

/** Streams an object, or one range of it (the worker's parallel ranged reads); see ObjectRead. */
export async function openObjectStream(key: string, read: ObjectRead = {}): Promise<Readable> {
  const body = await getObjectBody(key, read);
  if (!body) throw new Error(`The object store returned no body for ${key}`);
  return body as Readable;
}

/**
 * A download link for the object only while it is the one verified at completion: its ETag must
 * equal the one recorded then (a later write to the key, however it got there, is detected and not
 * served). Answers null when the object is missing or changed.
 */
export async function presignVerifiedDownload(key: string, fileName: string, verifiedEtag: string | null): Promise<string | null> {
  const stored = await headObject(key);
  if (!stored || !verifiedEtag || stored.etag !== verifiedEtag) return null;
  return presignDownload(key, fileName);
}

async function presignDownload(key: string, fileName: string): Promise<string> {
  const safeName = fileName.replace(/[^\w.\- ]+/g, "_");
  const command = new GetObjectCommand({
    Bucket: getEnv().S3_BUCKET, Key: key, ResponseContentDisposition: `attachment; filename="${safeName}"`, ResponseContentType: "text/csv",
  });
  return getSignedUrl(getPublicS3(), command, { expiresIn: DOWNLOAD_URL_TTL_S });
}

/** Only for uploads that never completed or were refused at completion; analysed objects are never deleted. */
export async function deleteIncompleteObject(key: string): Promise<void> {
  await getS3().send(new DeleteObjectCommand({ Bucket: getEnv().S3_BUCKET, Key: key }));
}

/**
 * Drops the parts of a multipart upload that will never be completed (an unknown upload id is not
 * an error). Answers false when the store has no abort call (the local fake): its parts stay.
 */
export async function abortMultipartUpload(key: string, uploadId: string): Promise<boolean> {
  try {
    await getS3().send(new AbortMultipartUploadCommand({ Bucket: getEnv().S3_BUCKET, Key: key, UploadId: uploadId }));
    return true;
  } catch (err) {
    const name = (err as { name?: string } | null)?.name;
    if (isNotFound(err) || name === "NoSuchUpload") return true;
    if (name === "MethodNotAllowed" || name === "NotImplemented") return false;
    throw err;
  }
}

export function isNotFound(err: unknown): boolean {
  const e = err as { name?: string; $metadata?: { httpStatusCode?: number } } | null;
  return e?.name === "NotFound" || e?.name === "NoSuchKey" || e?.$metadata?.httpStatusCode === 404;
}

export function isPreconditionFailed(err: unknown): boolean {
  const e = err as { name?: string; $metadata?: { httpStatusCode?: number } } | null;
  return e?.name === "PreconditionFailed" || e?.$metadata?.httpStatusCode === 412;
}
