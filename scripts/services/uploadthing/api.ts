/**
 * The server-to-server side, authenticated by `x-uploadthing-api-key`: the app's route-metadata
 * registration and callback result (on the ingest URL), and the UTApi calls (on the API URL,
 * `/v6/...`) the app uses: deleteFiles, listFiles, getUsageInfo.
 */
import type { IncomingMessage, ServerResponse } from "node:http";
import { recordResult, register } from "./callbacks";
import { HttpFailure, readJson, sendJson } from "./http";
import { keyBelongsTo } from "./ingest";
import type { FakeStore } from "./store";

const USAGE_LIMIT_BYTES = 2 * 1024 ** 3;

function appOf(store: FakeStore, req: IncomingMessage): string {
  const header = req.headers["x-uploadthing-api-key"];
  const appId = store.appOfApiKey(typeof header === "string" ? header : undefined);
  if (!appId) throw new HttpFailure(401, "Invalid API key (x-uploadthing-api-key)");
  return appId;
}

const strings = (v: unknown): string[] | undefined => (Array.isArray(v) && v.every((x) => typeof x === "string") ? v : undefined);

export async function handleRouteMetadata(store: FakeStore, req: IncomingMessage, res: ServerResponse): Promise<void> {
  const appId = appOf(store, req);
  const body = await readJson(req);
  const fileKeys = strings(body.fileKeys);
  const { callbackUrl, callbackSlug } = body;
  if (!fileKeys || fileKeys.length === 0 || typeof callbackUrl !== "string" || typeof callbackSlug !== "string") {
    throw new HttpFailure(400, "route-metadata needs fileKeys, callbackUrl and callbackSlug");
  }
  if (!fileKeys.every((k) => keyBelongsTo(k, appId))) throw new HttpFailure(400, "a file key does not belong to this app");
  let url: URL;
  try {
    url = new URL(callbackUrl);
  } catch {
    throw new HttpFailure(400, "callbackUrl is not a URL");
  }
  // The SDK keeps the slug out of callbackUrl and expects it back as ?slug= on the hook.
  url.searchParams.set("slug", callbackSlug);
  const isDev = body.isDev === true;
  const reg = { appId, metadata: body.metadata ?? {}, isDev, callbackUrl: url.toString(), callbackSlug, awaitServerData: body.awaitServerData !== false };
  if (!isDev) {
    register(fileKeys, reg, null);
    sendJson(res, 200, { ok: true });
    return;
  }
  // Development: keep the response open and write one JSON line per finished file.
  res.writeHead(200, { "content-type": "text/plain; charset=utf-8", "cache-control": "no-store" });
  res.flushHeaders();
  register(fileKeys, reg, res);
  const timer = setTimeout(() => res.end(), 60 * 60 * 1000);
  res.on("close", () => clearTimeout(timer));
}

export async function handleCallbackResult(store: FakeStore, req: IncomingMessage, res: ServerResponse): Promise<void> {
  const appId = appOf(store, req);
  const body = await readJson(req);
  if (typeof body.fileKey !== "string" || !keyBelongsTo(body.fileKey, appId)) throw new HttpFailure(400, "callback-result needs a fileKey of this app");
  recordResult(body.fileKey, typeof body.error === "string" ? { error: body.error } : { callbackData: body.callbackData ?? null });
  sendJson(res, 200, { ok: true });
}

export async function handleApi(store: FakeStore, req: IncomingMessage, res: ServerResponse, name: string): Promise<void> {
  const appId = appOf(store, req);
  const body = await readJson(req);
  switch (name) {
    case "deleteFiles": {
      const fileKeys = strings(body.fileKeys);
      const customIds = strings(body.customIds);
      if (!fileKeys && !customIds) throw new HttpFailure(400, "deleteFiles needs fileKeys or customIds");
      const deletedCount = store.delete(appId, { fileKeys, customIds });
      sendJson(res, 200, { success: true, deletedCount });
      return;
    }
    case "listFiles": {
      const limit = typeof body.limit === "number" ? body.limit : 500;
      const offset = typeof body.offset === "number" ? body.offset : 0;
      const all = store.list(appId);
      const files = all.slice(offset, offset + limit).map((f) => ({
        id: f.key, customId: f.customId, key: f.key, name: f.name, size: f.size, status: "Uploaded", uploadedAt: f.uploadedAt,
      }));
      sendJson(res, 200, { hasMore: offset + limit < all.length, files });
      return;
    }
    case "getUsageInfo": {
      const bytes = store.list(appId).reduce((n, f) => n + f.size, 0);
      sendJson(res, 200, { totalBytes: bytes, appTotalBytes: bytes, filesUploaded: store.list(appId).length, limitBytes: USAGE_LIMIT_BYTES });
      return;
    }
    default:
      throw new HttpFailure(404, `/v6/${name} is not implemented by the local fake`);
  }
}
