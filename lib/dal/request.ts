import "server-only";
import type { z } from "zod";
import { HttpError } from "@/lib/auth/guards";

const MAX_JSON_BYTES = 64 * 1024;

/** Reads a JSON body and parses it with `schema`; anything else is a 400 naming the first problems. */
export async function readJson<S extends z.ZodType>(request: Request, schema: S): Promise<z.output<S>> {
  // Only JSON bodies: a cross-site HTML form cannot send this content type without a CORS preflight.
  if (!/^application\/json\b/i.test(request.headers.get("content-type") ?? "")) {
    throw new HttpError(415, "Send the body as JSON (Content-Type: application/json)");
  }
  const text = await readBounded(request, MAX_JSON_BYTES);
  let raw: unknown;
  try {
    raw = text === "" ? {} : JSON.parse(text);
  } catch {
    throw new HttpError(400, "The request body is not valid JSON");
  }
  return parseInput(schema, raw);
}

/**
 * The body as text, refusing (413) anything over `limit` bytes without reading further: a declared
 * length is checked first, then the stream is cut at the limit whatever the header said.
 */
export async function readBounded(request: Request, limit: number): Promise<string> {
  const tooLarge = () => new HttpError(413, `The request body is larger than ${limit / 1024} KiB`);
  const declared = Number(request.headers.get("content-length") ?? "");
  if (Number.isFinite(declared) && declared > limit) throw tooLarge();
  if (!request.body) return "";
  const reader = request.body.getReader();
  const chunks: Uint8Array[] = [];
  let size = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    size += value.byteLength;
    if (size > limit) {
      await reader.cancel().catch(() => undefined);
      throw tooLarge();
    }
    chunks.push(value);
  }
  const whole = new Uint8Array(size);
  let at = 0;
  for (const chunk of chunks) {
    whole.set(chunk, at);
    at += chunk.byteLength;
  }
  try {
    return new TextDecoder("utf-8", { fatal: true }).decode(whole);
  } catch {
    throw new HttpError(400, "The request body is not UTF-8 text");
  }
}

export function parseInput<S extends z.ZodType>(schema: S, raw: unknown): z.output<S> {
  const parsed = schema.safeParse(raw);
  if (!parsed.success) {
    const problems = parsed.error.issues.slice(0, 3).map((i) => (i.path.length ? `${i.path.join(".")}: ${i.message}` : i.message));
    throw new HttpError(400, problems.join("; "));
  }
  return parsed.data;
}

/** Route ids are uuids; anything else cannot exist, so it is a 404 like a missing row. */
export function requireUuid(id: string, what: string): string {
  if (!/^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i.test(id)) throw new HttpError(404, `No such ${what}`);
  return id.toLowerCase();
}
