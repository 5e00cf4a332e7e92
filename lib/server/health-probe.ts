import type { IncomingMessage, ServerResponse } from "node:http";
import { HEALTH_HEADERS, healthAnswer, isHealthPath, type HealthAnswer } from "./health";
import { SITE_HEADERS } from "./site-headers.mjs";

// The health probes on a plain Node server (scripts/serve.ts, before Next): the same answers as the
// route handlers, without Next's proxy, routing and response machinery on every probe. It bypasses
// Next, so it sends the site's security headers itself (the ones next.config.mjs gives Next's answers).

function send(res: ServerResponse, { status, body }: HealthAnswer, head: boolean): void {
  const json = JSON.stringify(body);
  res.writeHead(status, { ...SITE_HEADERS, ...HEALTH_HEADERS, "Content-Type": "application/json", "Content-Length": Buffer.byteLength(json) });
  res.end(head ? undefined : json);
}

/** Answers a GET or HEAD of a probe path (a query string is ignored) and returns true; false for any other request. */
export function answerProbe(req: IncomingMessage, res: ServerResponse): boolean {
  if (req.method !== "GET" && req.method !== "HEAD") return false;
  const path = (req.url ?? "").split("?")[0] ?? "";
  if (!isHealthPath(path)) return false;
  const head = req.method === "HEAD";
  Promise.resolve(healthAnswer(path)).then(
    (answer) => send(res, answer, head),
    // getReadiness never rejects (each check's failure is a state); this is the last resort.
    () => send(res, { status: 503, body: { ready: false } }, head),
  );
  return true;
}
