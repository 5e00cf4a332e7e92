// CORS of the local object store, answered by its gate (not by the store's bucket rules): only the
// app's own origins may call it from a browser.
import type { IncomingMessage, ServerResponse } from "node:http";
import { sendError } from "./errors";

const METHODS = ["GET", "HEAD", "PUT", "POST", "DELETE"];
const EXPOSED = ["ETag", "x-amz-checksum-sha256", "x-amz-version-id", "Content-Length", "Content-Type"];
const HEADER_NAME = /^[A-Za-z0-9-]+$/;

export function corsHeaders(origin: string | undefined, allowed: ReadonlySet<string>): Record<string, string> {
  if (!origin || !allowed.has(origin)) return {};
  return { "Access-Control-Allow-Origin": origin, "Access-Control-Expose-Headers": EXPOSED.join(", "), Vary: "Origin" };
}

/** Answers a preflight: 200 with the rules for an allowed origin and method, 403 otherwise. */
export function answerPreflight(req: IncomingMessage, res: ServerResponse, allowed: ReadonlySet<string>): void {
  const origin = req.headers.origin;
  const method = String(req.headers["access-control-request-method"] ?? "");
  const requested = String(req.headers["access-control-request-headers"] ?? "").split(",").map((h) => h.trim()).filter(Boolean);
  if (!origin || !method) {
    sendError(res, 400, "BadRequest", "A CORS preflight needs Origin and Access-Control-Request-Method headers");
    return;
  }
  if (!allowed.has(origin) || !METHODS.includes(method) || requested.some((h) => !HEADER_NAME.test(h))) {
    sendError(res, 403, "AccessForbidden", `CORSResponse: this CORS request is not allowed (origin ${origin.slice(0, 200)} is not the app's)`, { Vary: "Origin" });
    return;
  }
  res.writeHead(200, {
    "Access-Control-Allow-Origin": origin,
    "Access-Control-Allow-Methods": METHODS.join(", "),
    ...(requested.length ? { "Access-Control-Allow-Headers": requested.join(", ") } : {}),
    "Access-Control-Expose-Headers": EXPOSED.join(", "),
    "Access-Control-Max-Age": "600",
    Vary: "Origin",
    "Content-Length": "0",
  });
  res.end();
}
