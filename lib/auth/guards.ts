import "server-only";
import { getServerSession } from "next-auth";
import { redirect } from "next/navigation";
import type { Role } from "@/db/schema";
import { guessService, isConnectionFailure, logDetail, outageSentence } from "@/lib/server/outage";
import { authOptions, type SessionUser } from "./options";

export async function getSessionUser(): Promise<SessionUser | null> {
  const session = await getServerSession(authOptions);
  return session?.user?.id ? session.user : null;
}

/** For pages and server actions: no session -> sign-in page. */
export async function requireUser(): Promise<SessionUser> {
  const user = await getSessionUser();
  if (!user) redirect("/sign-in");
  return user;
}

/** For pages and server actions: wrong role -> access-denied page. */
export async function requireRole(...roles: Role[]): Promise<SessionUser> {
  const user = await requireUser();
  if (!roles.includes(user.role)) redirect("/access-denied");
  return user;
}

export class HttpError extends Error {
  /** `retryAfterS` becomes a Retry-After header (409 upload in progress, 429 backlog full). */
  constructor(readonly status: number, message: string, readonly retryAfterS?: number) {
    super(message);
  }
}

/** For route handlers: throws HttpError(401/403); turn it into JSON with `errorResponse`. */
export async function requireApiUser(...roles: Role[]): Promise<SessionUser> {
  const user = await getSessionUser();
  if (!user) throw new HttpError(401, "Sign in first.");
  if (roles.length > 0 && !roles.includes(user.role)) throw new HttpError(403, "Your role may not do this.");
  return user;
}

/** Seconds a client is asked to wait after a service outage (503). */
const OUTAGE_RETRY_AFTER_S = 30;

/** The JSON answer for a thrown error: its own message for an HttpError, a sentence for anything else (details to the log). */
export function errorResponse(err: unknown): Response {
  if (err instanceof HttpError) {
    const headers = err.retryAfterS !== undefined ? { "Retry-After": String(err.retryAfterS) } : undefined;
    return Response.json({ error: err.message }, { status: err.status, headers });
  }
  if (isConnectionFailure(err)) {
    const service = guessService(err);
    console.error(`${service} unreachable: ${logDetail(err)}`);
    return Response.json({ error: outageSentence(service, "later") }, { status: 503, headers: { "Retry-After": String(OUTAGE_RETRY_AFTER_S) } });
  }
  console.error(err);
  return Response.json({ error: "Something went wrong on the server." }, { status: 500 });
}
