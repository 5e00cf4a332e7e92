import type { IncomingMessage, ServerResponse } from "node:http";

export class HttpFailure extends Error {
  constructor(readonly status: number, message: string) {
    super(message);
  }
}

/** Browsers PUT from the app's origin with the SDK's headers (Range, x-uploadthing-version, b3, traceparent). */
export function setCors(req: IncomingMessage, res: ServerResponse): void {
  res.setHeader("access-control-allow-origin", req.headers.origin ?? "*");
  res.setHeader("vary", "origin");
  res.setHeader("access-control-allow-methods", "GET, HEAD, PUT, POST, OPTIONS");
  res.setHeader("access-control-allow-headers", req.headers["access-control-request-headers"] ?? "*");
  res.setHeader("access-control-expose-headers", "x-ut-range-start, etag, content-length, content-type");
  res.setHeader("access-control-max-age", "600");
}

export function sendJson(res: ServerResponse, status: number, body: unknown): void {
  const text = JSON.stringify(body);
  res.writeHead(status, { "content-type": "application/json", "content-length": Buffer.byteLength(text) });
  res.end(text);
}

/** The whole body, refused with 413 once it passes `limit` bytes. */
export function readBody(req: IncomingMessage, limit: number): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = [];
    let size = 0;
    req.on("data", (c: Buffer) => {
      size += c.length;
      if (size > limit) {
        reject(new HttpFailure(413, `the request body is larger than ${limit} bytes`));
        req.destroy();
        return;
      }
      chunks.push(c);
    });
    req.on("end", () => resolve(Buffer.concat(chunks)));
    req.on("error", reject);
  });
}

export async function readJson(req: IncomingMessage, limit = 1024 * 1024): Promise<Record<string, unknown>> {
  const text = (await readBody(req, limit)).toString("utf8");
  try {
    const value: unknown = JSON.parse(text);
    if (value && typeof value === "object" && !Array.isArray(value)) return value as Record<string, unknown>;
  } catch {
    // fall through
  }
  throw new HttpFailure(400, "the body is not a JSON object");
}

/** The `file` field of a multipart/form-data body, as the SDK's browser and server uploads send it. */
export async function multipartFile(body: Buffer, contentType: string | undefined): Promise<Buffer> {
  if (!contentType?.startsWith("multipart/form-data")) throw new HttpFailure(415, "send the file as multipart/form-data with a `file` field");
  let form: FormData;
  try {
    form = await new Response(new Uint8Array(body), { headers: { "content-type": contentType } }).formData();
  } catch {
    throw new HttpFailure(400, "the multipart body could not be parsed");
  }
  const file = form.get("file");
  if (!file || typeof file === "string") throw new HttpFailure(400, "the multipart body has no `file` field");
  return Buffer.from(await file.arrayBuffer());
}

/** `filename*` per RFC 6266 / RFC 5987, with an ASCII fallback. */
export function contentDisposition(kind: "inline" | "attachment", name: string): string {
  const ascii = name.replace(/[^\x20-\x7e]|["\\]/g, "_");
  return `${kind}; filename="${ascii}"; filename*=UTF-8''${encodeURIComponent(name)}`;
}
