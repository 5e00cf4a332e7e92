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

/** A single PUT, bound to the key and the exact length (a store that checks signatures refuses any other). */
export async function presignSinglePut(key: string, sizeBytes: number): Promise<string> {
  const command = new PutObjectCommand({ Bucket: getEnv().S3_BUCKET, Key: key, ContentLength: sizeBytes, ContentType: "text/csv" });
  return getSignedUrl(getPublicS3(), command, { expiresIn: UPLOAD_URL_TTL_S });
}

export async function createMultipartUpload(key: string): Promise<string> {
  const out = await getS3().send(new CreateMultipartUploadCommand({ Bucket: getEnv().S3_BUCKET, Key: key, ContentType: "text/csv" }));
  if (!out.UploadId) throw new Error("The object store returned no multipart upload id");
  return out.UploadId;
}

export async function presignParts(key: string, uploadId: string, partNumbers: readonly number[]): Promise<{ partNumber: number; url: string }[]> {
  const bucket = getEnv().S3_BUCKET;
  return Promise.all(
    partNumbers.map(async (partNumber) => ({
      partNumber,
      url: await getSignedUrl(getPublicS3(), new UploadPartCommand({ Bucket: bucket, Key: key, UploadId: uploadId, PartNumber: partNumber }), {
        expiresIn: UPLOAD_URL_TTL_S,
      }),
    })),
  );
}

export async function completeMultipartUpload(key: string, uploadId: string, parts: readonly { partNumber: number; etag: string }[]): Promise<void> {
  await getS3().send(
    new CompleteMultipartUploadCommand({
      Bucket: getEnv().S3_BUCKET, Key: key, UploadId: uploadId,
      MultipartUpload: { Parts: [...parts].sort((a, b) => a.partNumber - b.partNumber).map((p) => ({ PartNumber: p.partNumber, ETag: p.etag })) },
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

/** The first bytes of an object, for a header check before queueing. */
export async function readObjectHead(key: string, bytes: number): Promise<Uint8Array> {
  const out = await getS3().send(new GetObjectCommand({ Bucket: getEnv().S3_BUCKET, Key: key, Range: `bytes=0-${bytes - 1}` }));
  if (!out.Body) return new Uint8Array(0);
  return out.Body.transformToByteArray();
}

/** Streams an object; with `etag`, fails with a 412 when the object changed since the upload was completed. */
export async function openObjectStream(key: string, etag?: string): Promise<Readable> {
  const out = await getS3().send(new GetObjectCommand({ Bucket: getEnv().S3_BUCKET, Key: key, IfMatch: etag || undefined }));
  if (!out.Body) throw new Error(`The object store returned no body for ${key}`);
  return out.Body as Readable;
}

export async function presignDownload(key: string, fileName: string): Promise<string> {
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
