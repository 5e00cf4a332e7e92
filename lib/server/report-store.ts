import "server-only";
import { GetObjectCommand, PutObjectCommand } from "@aws-sdk/client-s3";
import { createHash } from "node:crypto";
import { getEnv } from "./env";
import { getS3, headObject } from "./storage";

// Released report PDFs in object storage. A key is written once: it names the lab, the report number,
// the revision and the content hash, and a second write to an existing key is refused here.

export function reportObjectKey(labId: string, number: string, revision: number, sha256: string): string {
  const safeNumber = number.replace(/[^A-Za-z0-9._-]+/g, "_");
  return `reports/${labId}/${safeNumber}/rev-${revision}-${sha256}.pdf`;
}

export function sha256Hex(bytes: Uint8Array): string {
  return createHash("sha256").update(bytes).digest("hex");
}

/** Stores released bytes under a fresh key; the store is told the sha256 so it refuses other bytes. */
export async function putReportPdf(key: string, bytes: Uint8Array, sha256: string): Promise<void> {
  if (await headObject(key)) throw new Error(`A released report is already stored under ${key}`);
  await getS3().send(
    new PutObjectCommand({
      Bucket: getEnv().S3_BUCKET, Key: key, Body: bytes, ContentLength: bytes.byteLength, ContentType: "application/pdf",
      ChecksumSHA256: Buffer.from(sha256, "hex").toString("base64"),
    }),
  );
}

/** The stored bytes of a released report; the caller compares their sha256 with the recorded one. */
export async function readReportPdf(key: string): Promise<Uint8Array> {
  const out = await getS3().send(new GetObjectCommand({ Bucket: getEnv().S3_BUCKET, Key: key }));
  if (!out.Body) throw new Error(`The object store returned no body for ${key}`);
  return out.Body.transformToByteArray();
}
