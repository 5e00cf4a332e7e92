import "server-only";
import { getServerSession } from "next-auth";
import { cache } from "react";
import { forbidden, redirect } from "next/navigation";
import type { Role } from "@/db/schema";
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
  constructor(readonly status: number, message: string) {
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

export function errorResponse(err: unknown): Response {
  if (err instanceof HttpError) return Response.json({ error: err.message }, { status: err.status });
  console.error(err);
  return Response.json({ error: "Something went wrong on the server." }, { status: 500 });
}
