// Connection-level failures of the services behind the app. They say nothing about a capture:
// the work is retried once the service answers again, and people see a sentence, never the
// driver's text (which carries SQL, parameters, hosts and ports).

export type OutageService = "database" | "queue" | "file store";

/** A service that did not answer; `cause` keeps the driver's error for the log. */
export class ServiceOutage extends Error {
  override name = "ServiceOutage";
  constructor(readonly service: OutageService, readonly cause: unknown) {
    super(outageSentence(service, "later"));
  }
}

/** Socket-level codes: the peer is down, restarting, unreachable or dropped the connection. */
const NETWORK_CODES = new Set([
  "ECONNREFUSED", "ECONNRESET", "ECONNABORTED", "EPIPE", "ETIMEDOUT", "EHOSTUNREACH", "EHOSTDOWN", "ENETUNREACH",
  "ENETDOWN", "ENOTFOUND", "EAI_AGAIN", "ESOCKETTIMEDOUT", "UND_ERR_SOCKET", "UND_ERR_CONNECT_TIMEOUT",
]);

/**
 * PostgreSQL SQLSTATEs of a server that is going away or not accepting work yet (PostgreSQL
 * documentation, appendix A "Error Codes": class 08 connection exception, 57P01 admin_shutdown,
 * 57P02 crash_shutdown, 57P03 cannot_connect_now, 53300 too_many_connections).
 */
const PG_TEMPORARY = /^(08\d{3}|57P0[1-3]|53300)$/;

/** Messages of drivers that throw plain errors on a lost connection (pg, ioredis). */
const LOST_CONNECTION = [
  /connection terminated/i, /timeout exceeded when trying to connect/i, /connection is closed/i,
  /stream isn't writeable/i, /reached the max retries per request/i, /socket hang up/i, /client network socket disconnected/i,
  /server closed the connection unexpectedly/i, /the database system is (starting up|shutting down|in recovery mode)/i,
];

type ErrorLike = { name?: unknown; code?: unknown; message?: unknown; cause?: unknown; errors?: unknown; $metadata?: { httpStatusCode?: number } };

function* chain(err: unknown): Generator<ErrorLike> {
  const seen = new Set<unknown>();
  const stack: unknown[] = [err];
  while (stack.length > 0) {
    const e = stack.pop();
    if (!e || typeof e !== "object" || seen.has(e)) continue;
    seen.add(e);
    const like = e as ErrorLike;
    yield like;
    stack.push(like.cause);
    // AggregateError (Node's happy-eyeballs connect tries every address).
    if (Array.isArray(like.errors)) stack.push(...(like.errors as unknown[]));
  }
}

/** True when `err` (or anything in its cause chain) is a connection-level failure rather than an answer. */
export function isConnectionFailure(err: unknown): boolean {
  for (const e of chain(err)) {
    if (e instanceof ServiceOutage) return true;
    const code = typeof e.code === "string" ? e.code : "";
    if (NETWORK_CODES.has(code) || PG_TEMPORARY.test(code)) return true;
    const name = typeof e.name === "string" ? e.name : "";
    if (name === "TimeoutError" || name === "MaxRetriesPerRequestError") return true;
    // An S3 endpoint that answers 5xx or 429 (throttled) is busy or restarting: try again later.
    const status = e.$metadata?.httpStatusCode;
    if (status !== undefined && (status >= 500 || status === 429)) return true;
    const message = typeof e.message === "string" ? e.message : "";
    if (LOST_CONNECTION.some((re) => re.test(message))) return true;
  }
  return false;
}

/** The outage behind `err` (already classified, or connection-level while talking to `service`), else null. */
export function asOutage(err: unknown, service: OutageService): ServiceOutage | null {
  if (err instanceof ServiceOutage) return err;
  return isConnectionFailure(err) ? new ServiceOutage(service, err) : null;
}

/** The service an unclassified connection failure most likely came from, by the error's shape. */
export function guessService(err: unknown): OutageService {
  for (const e of chain(err)) {
    if (e instanceof ServiceOutage) return e.service;
    if (e.$metadata) return "file store";
    const text = `${typeof e.name === "string" ? e.name : ""} ${typeof e.message === "string" ? e.message : ""}`;
    if (/MaxRetriesPerRequest|connection is closed|stream isn't writeable|redis/i.test(text)) return "queue";
  }
  return "database";
}

/** Runs `work` against `service`, turning a connection-level failure into a ServiceOutage. */
export async function talkingTo<T>(service: OutageService, work: () => Promise<T>): Promise<T> {
  try {
    return await work();
  } catch (err) {
    throw asOutage(err, service) ?? err;
  }
}

/** What people read: which service did not answer and what happens next. */
export function outageSentence(service: OutageService, next: "analysis" | "later"): string {
  const what = service === "database" ? "The database" : service === "queue" ? "The job queue" : "The file store";
  return next === "analysis"
    ? `${what} was unreachable; the analysis will be retried.`
    : `${what} was unreachable; please try again in a minute.`;
}

/** The driver's own words for the log (never for a page or a response). */
export function logDetail(err: unknown): string {
  const parts: string[] = [];
  for (const e of chain(err)) {
    const message = typeof e.message === "string" ? e.message.split("\n")[0] : "";
    const code = typeof e.code === "string" ? ` [${e.code}]` : "";
    if (message || code) parts.push(`${message}${code}`);
  }
  return parts.join(" <- ") || String(err);
}
