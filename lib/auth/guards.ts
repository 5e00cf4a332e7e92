import "server-only";
import { getServerSession } from "next-auth";
import { cache } from "react";
import { forbidden, redirect } from "next/navigation";
import type { Role } from "@/db/schema";
import { guessService, isConnectionFailure, logDetail, outageSentence } from "@/lib/server/outage";
import { authOptions, type SessionUser } from "./options";

/** The signed-in user, re-checked against the database (lib/auth/options.ts), once per request. */
export const getSessionUser = cache(async (): Promise<SessionUser | null> => {
  const session = await getServerSession(authOptions);
  return session?.user?.id ? session.user : null;
});

/** For pages and server actions: no session -> sign-in page. */
export async function requireUser(): Promise<SessionUser> {
  const user = await getSessionUser();
  if (!user) redirect("/sign-in");
  return user;
}

/** For pages and server actions: wrong role -> 403 (app/(app)/forbidden.tsx, with the app's menu). */
export async function requireRole(...roles: Role[]): Promise<SessionUser> {
  const user = await requireUser();
  if (!roles.includes(user.role)) forbidden();
  return user;
}

export class HttpError extends Error {
  /** `retryAfterS` becomes a Retry-After header (409 upload in progress, 429 backlog full). */
  constructor(readonly status: number, message: string, readonly retryAfterS?: number) {
    super(message);
  }
}

/** For route handlers: throws HttpError(401/403); `apiRoute` (lib/dal/route-handler.ts) turns it into JSON. */
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
