/**
 * The ingest side: the browser's (or UTApi's) HEAD and multipart PUT to a presigned URL, and file
 * serving by key. Every presigned URL is checked as the service would: the app named by
 * `x-ut-identifier` exists, the HMAC over the URL verifies with that app's key, `expires` is in the
 * future and the file key carries that app's prefix.
 */
import { createReadStream } from "node:fs";
import type { IncomingMessage, ServerResponse } from "node:http";
import { verifyKey } from "@uploadthing/shared";
import * as Micro from "effect/Micro";
import { callbackBody, deliverHook, forget, registrationOf, resultOf } from "./callbacks";
import { contentDisposition, HttpFailure, multipartFile, readBody, sendJson } from "./http";
import { parseRangeStart, signedField, verifySignedUrl } from "./signing";
import { isFileKey, type FakeStore, type StoredFile } from "./store";

export type IngestContext = { store: FakeStore; origin: string };

const MULTIPART_OVERHEAD = 64 * 1024;
const SERVER_DATA_WAIT_MS = 30_000;

export const keyBelongsTo = (key: string, appId: string) => Micro.runSync(verifyKey(key, appId));

const fullUrl = (req: IncomingMessage) => `http://${req.headers.host ?? "127.0.0.1"}${req.url ?? "/"}`;

function checkPresigned(ctx: IngestContext, req: IncomingMessage, key: string) {
  const check = verifySignedUrl(fullUrl(req), (p) => ctx.store.apiKeyOf(signedField(p, "x-ut-identifier") ?? ""), Date.now());
  if (!check.ok) throw new HttpFailure(check.status, `presigned URL refused: ${check.reason}`);
  const field = (name: string) => signedField(check.params, name);
  const appId = field("x-ut-identifier") ?? "";
  if (!isFileKey(key) || !keyBelongsTo(key, appId)) throw new HttpFailure(403, "the file key does not belong to this app");
  const size = Number(field("x-ut-file-size"));
  if (!Number.isSafeInteger(size) || size < 0) throw new HttpFailure(400, "x-ut-file-size is missing");
  return {
    appId, key, size,
    name: field("x-ut-file-name") ?? key,
    type: field("x-ut-file-type") || "application/octet-stream",
    customId: field("x-ut-custom-id"),
    slug: field("x-ut-slug"),
    acl: field("x-ut-acl") === "private" ? "private" as const : "public-read" as const,
    contentDisposition: field("x-ut-content-disposition") === "attachment" ? "attachment" as const : "inline" as const,
  };
}

export function handleIngestHead(ctx: IngestContext, req: IncomingMessage, res: ServerResponse, key: string): void {
  const up = checkPresigned(ctx, req, key);
  res.writeHead(200, { "x-ut-range-start": String(ctx.store.get(up.appId, key) ? 0 : ctx.store.partialSize(up.appId, key)) });
  res.end();
}

export async function handleIngestPut(ctx: IngestContext, req: IncomingMessage, res: ServerResponse, key: string): Promise<void> {
  const up = checkPresigned(ctx, req, key);
  if (ctx.store.get(up.appId, key)) throw new HttpFailure(409, "this file key has already been uploaded");
  const start = parseRangeStart(req.headers.range);
  const have = ctx.store.partialSize(up.appId, key);
  if (start === null || (start !== 0 && start !== have)) {
    throw new HttpFailure(416, `resume from byte ${have} (Range: bytes=${have}-)`);
  }
  const bytes = await multipartFile(await readBody(req, up.size - start + MULTIPART_OVERHEAD), req.headers["content-type"]);
  const total = start + bytes.length;
  if (total > up.size) {
    ctx.store.discardPartial(up.appId, key);
    const message = `received ${total} bytes, but the upload was signed for ${up.size}`;
    void reportError(ctx, up.appId, key, message);
    throw new HttpFailure(413, message);
  }
  ctx.store.writePart(up.appId, key, start, bytes);
  if (total < up.size) throw new HttpFailure(400, `incomplete: ${total} of ${up.size} bytes received; resume with Range: bytes=${total}-`);
  const file = ctx.store.complete({
    appId: up.appId, key, name: up.name, size: up.size, type: up.type, customId: up.customId,
    acl: up.acl, contentDisposition: up.contentDisposition, lastModified: null,
  });
  const urls = fileUrls(ctx, file);
  console.log(`${new Date().toISOString()} stored ${up.appId}/${key} (${file.size} bytes, ${file.type})`);
  // A file uploaded through a file route (x-ut-slug) goes back to the app; a UTApi upload does not.
  const serverData = up.slug ? await notifyApp(ctx, file, urls) : null;
  sendJson(res, 200, { ...urls, fileHash: file.fileHash, serverData });
}

function fileUrls(ctx: IngestContext, file: StoredFile) {
  const appUrl = `${ctx.origin}/a/${file.appId}/${file.key}`;
  return { url: `${ctx.origin}/f/${file.key}`, appUrl, ufsUrl: appUrl };
}

async function notifyApp(ctx: IngestContext, file: StoredFile, urls: ReturnType<typeof fileUrls>): Promise<unknown> {
  const reg = await registrationOf(file.key);
  if (!reg || reg.appId !== file.appId) throw new HttpFailure(502, "the app never registered this upload (POST /route-metadata)");
  const apiKey = ctx.store.apiKeyOf(file.appId) ?? "";
  const failure = await deliverHook(reg, file.key, "callback", callbackBody(file, reg, ctx.origin, urls.url, urls.appUrl), apiKey);
  if (failure) throw new HttpFailure(502, failure);
  if (!reg.awaitServerData) return null;
  const result = await resultOf(file.key, SERVER_DATA_WAIT_MS);
  forget(file.key);
  if (!result) throw new HttpFailure(504, "the app did not report the result of onUploadComplete (POST /callback-result)");
  if ("error" in result) throw new HttpFailure(502, result.error);
  return result.callbackData;
}

async function reportError(ctx: IngestContext, appId: string, key: string, error: string): Promise<void> {
  const reg = await registrationOf(key, 0);
  if (!reg) return;
  await deliverHook(reg, key, "error", JSON.stringify({ fileKey: key, error }), ctx.store.apiKeyOf(appId) ?? "");
  forget(key);
}

/** GET/HEAD /f/<key> and /a/<appId>/<key>. Private files need a URL signed with the app's key. */
export function serveFile(ctx: IngestContext, req: IncomingMessage, res: ServerResponse, key: string, appId: string | null): void {
  const file = appId ? ctx.store.get(appId, key) : ctx.store.find(key);
  if (!file) throw new HttpFailure(404, "no such file");
  if (file.acl === "private") {
    const check = verifySignedUrl(fullUrl(req), () => ctx.store.apiKeyOf(file.appId), Date.now());
    if (!check.ok) throw new HttpFailure(403, `this file is private: ${check.reason}`);
  }
  res.writeHead(200, {
    "content-type": file.type,
    "content-length": String(file.size),
    "content-disposition": contentDisposition(file.contentDisposition, file.name),
    etag: `"${file.fileHash}"`,
    "cache-control": file.acl === "private" ? "private, max-age=60" : "public, max-age=31536000, immutable",
  });
  if (req.method === "HEAD") {
    res.end();
    return;
  }
  createReadStream(ctx.store.bytesPath(file)).pipe(res);
}
