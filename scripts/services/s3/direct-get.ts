// Object reads served by the gate straight from the store's files, without the hop through s3rver:
// a 1 GiB capture read back by the worker otherwise crosses two loopback sockets in one event loop
// with 64 KiB chunks, which made the local store, not the engine, the pace of a large analysis.
// Only the plain case is taken here (a signed GET of an object whose files are complete, with at
// most one byte range and the response-* overrides); everything else (lists, subresources, HEAD,
// multi-range, a missing object and its error body) still goes to s3rver. Unlike s3rver, If-Match
// is honoured (412 PreconditionFailed), as S3 does: the worker reads with the ETag it verified.
import { createReadStream, existsSync, readFileSync, statSync } from "node:fs";
import type { IncomingMessage, ServerResponse } from "node:http";
import path from "node:path";
import { S3Failure } from "./errors";
import type { ObjectTarget } from "./uploads";

const READ_CHUNK = 1 << 20;
const OVERRIDES: Record<string, string> = {
  "response-content-type": "content-type",
  "response-content-disposition": "content-disposition",
  "response-content-language": "content-language",
  "response-content-encoding": "content-encoding",
  "response-cache-control": "cache-control",
  "response-expires": "expires",
};
const SAFE_SEGMENT = /^(?!\.{1,2}$)[^\0]+$/;

type Range = { start: number; end: number };

/** Byte range of a `Range` header against `size`; null for none, "multi" or "invalid" otherwise. */
export function parseRange(header: string | undefined, size: number): Range | null | "multi" | "invalid" {
  if (header === undefined) return null;
  const m = /^bytes=(\d*)-(\d*)$/.exec(header.trim());
  if (!m) return header.includes(",") ? "multi" : "invalid";
  const [, a = "", b = ""] = m;
  if (a === "" && b === "") return "invalid";
  if (a === "") {
    const suffix = Number(b);
    if (suffix === 0) return "invalid";
    return { start: Math.max(0, size - suffix), end: size - 1 };
  }
  const start = Number(a);
  const end = b === "" ? size - 1 : Math.min(Number(b), size - 1);
  if (start >= size || end < start) return "invalid";
  return { start, end };
}

/** The object file, its ETag (quoted) and stored headers, or null when s3rver should answer. */
function storedObject(dataDir: string, target: ObjectTarget): { file: string; size: number; mtime: Date; etag: string; meta: Record<string, string> } | null {
  const parts = target.key.split("/");
  if (!SAFE_SEGMENT.test(target.bucket) || target.bucket.includes("/") || !parts.every((p) => SAFE_SEGMENT.test(p))) return null;
  const name = parts.pop() as string;
  const base = path.join(dataDir, target.bucket, ...parts, `${name}._S3rver_`);
  const file = `${base}object`;
  if (!path.resolve(file).startsWith(path.resolve(dataDir) + path.sep)) return null;
  if (!existsSync(file) || !existsSync(`${base}object.md5`)) return null;
  const stat = statSync(file);
  let meta: Record<string, string> = {};
  try {
    meta = JSON.parse(readFileSync(`${base}metadata.json`, "utf8")) as Record<string, string>;
  } catch {
    return null;
  }
  return { file, size: stat.size, mtime: stat.mtime, etag: JSON.stringify(readFileSync(`${base}object.md5`, "utf8").trim()), meta };
}

const unquote = (etag: string): string => etag.replace(/^W\//, "").replace(/^"|"$/g, "");

/**
 * Answers a signed object GET from the store's files; false when the request is not the plain
 * case (the caller forwards it to s3rver).
 */
export function serveObjectGet(dataDir: string, target: ObjectTarget, url: URL, req: IncomingMessage, res: ServerResponse, cors: Record<string, string>): boolean {
  for (const name of url.searchParams.keys()) if (!name.startsWith("X-Amz-") && name !== "x-id" && !(name in OVERRIDES)) return false;
  const object = storedObject(dataDir, target);
  if (!object) return false;
  const range = parseRange(req.headers.range, object.size);
  if (range === "multi") return false;
  const ifMatch = req.headers["if-match"];
  if (ifMatch !== undefined && ifMatch !== "*" && !ifMatch.split(",").some((e) => unquote(e.trim()) === unquote(object.etag))) {
    throw new S3Failure(412, "PreconditionFailed", "At least one of the preconditions you specified did not hold");
  }
  const ifNoneMatch = req.headers["if-none-match"];
  if (ifNoneMatch !== undefined && (ifNoneMatch === "*" || ifNoneMatch.split(",").some((e) => unquote(e.trim()) === unquote(object.etag)))) {
    res.writeHead(304, { etag: object.etag, ...cors });
    res.end();
    return true;
  }
  if (range === "invalid") throw new S3Failure(416, "InvalidRange", "The requested range is not satisfiable");
  const headers: Record<string, string> = {
    ...object.meta, etag: object.etag, "last-modified": object.mtime.toUTCString(), "accept-ranges": "bytes", ...cors,
  };
  for (const [param, header] of Object.entries(OVERRIDES)) {
    const value = url.searchParams.get(param);
    if (value !== null) headers[header] = value;
  }
  const { start, end } = range ?? { start: 0, end: object.size - 1 };
  headers["content-length"] = String(Math.max(0, end + 1 - start));
  if (range) headers["content-range"] = `bytes ${start}-${end}/${object.size}`;
  res.writeHead(range ? 206 : 200, headers);
  if (object.size === 0) {
    res.end();
    return true;
  }
  const stream = createReadStream(object.file, { start, end, highWaterMark: READ_CHUNK });
  stream.on("error", () => res.destroy());
  stream.pipe(res);
  return true;
}
