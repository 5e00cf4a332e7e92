import { getReadiness } from "./readiness";

// The health probes' answers, in one place for both doors: the Next route handlers
// (app/api/health/**) and scripts/serve.ts, which answers these paths itself before Next so a
// probe costs no proxy, routing or rendering work (issue 12: ≥ 500 requests/s at 50 concurrent).

export type HealthAnswer = { status: number; body: unknown };

/** Probe paths and the answer each gives. `/api/health` is the older address of readiness. */
export const HEALTH_PATHS = ["/api/health/live", "/api/health/ready", "/api/health"] as const;
export type HealthPath = (typeof HEALTH_PATHS)[number];

/** What the route handlers add; next.config.mjs adds the site's security headers to their answers. */
export const HEALTH_HEADERS = { "Cache-Control": "no-store" } as const;

export function isHealthPath(path: string): path is HealthPath {
  return (HEALTH_PATHS as readonly string[]).includes(path);
}

/** Liveness: the process answers. Touches no service, so it stays cheap under any load. */
export function liveAnswer(): HealthAnswer {
  return { status: 200, body: { ok: true } };
}

/** Readiness from the cached checks (lib/server/readiness.ts): 200 while the required services answer, else 503. */
export async function readyAnswer(): Promise<HealthAnswer> {
  const readiness = await getReadiness();
  return { status: readiness.ready ? 200 : 503, body: readiness };
}

/** The older `/api/health` shape: `{ ok, services }`. */
export async function legacyHealthAnswer(): Promise<HealthAnswer> {
  const readiness = await getReadiness();
  return { status: readiness.ready ? 200 : 503, body: { ok: readiness.ready, services: readiness.services } };
}

export function healthAnswer(path: HealthPath): HealthAnswer | Promise<HealthAnswer> {
  if (path === "/api/health/live") return liveAnswer();
  return path === "/api/health/ready" ? readyAnswer() : legacyHealthAnswer();
}

export function healthResponse({ status, body }: HealthAnswer): Response {
  return Response.json(body, { status, headers: HEALTH_HEADERS });
}
