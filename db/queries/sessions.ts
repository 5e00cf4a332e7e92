import { and, eq, gt, isNull, ne, sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { organisations, userSessions, users } from "@/db/schema";

/** Starts a session row for a sign-in; its id goes into the token. */
export async function insertSession(userId: string, ttlS: number): Promise<string> {
  const [row] = await getDb().insert(userSessions)
    .values({ userId, expiresAt: sql`now() + make_interval(secs => ${ttlS})` })
    .returning({ id: userSessions.id });
  if (!row) throw new Error("session row not created");
  return row.id;
}

/**
 * The user behind a live session: the row is not ended or expired, the account is enabled and its
 * session_version is still the one the token was issued with. Role and organisation come from here,
 * never from the token.
 */
export async function findLiveSessionUser(sessionId: string, userId: string, sessionVersion: number) {
  const rows = await getDb()
    .select({
      id: users.id, email: users.email, name: users.name, role: users.role, organisationId: users.organisationId,
      organisationName: organisations.name, organisationKind: organisations.kind,
    })
    .from(userSessions)
    .innerJoin(users, eq(users.id, userSessions.userId))
    .innerJoin(organisations, eq(organisations.id, users.organisationId))
    .where(and(
      eq(userSessions.id, sessionId), eq(userSessions.userId, userId), isNull(userSessions.endedAt), gt(userSessions.expiresAt, sql`now()`),
      isNull(users.disabledAt), eq(users.sessionVersion, sessionVersion),
    ))
    .limit(1);
  return rows[0];
}

export async function endSession(sessionId: string): Promise<void> {
  await getDb().update(userSessions).set({ endedAt: sql`now()` }).where(and(eq(userSessions.id, sessionId), isNull(userSessions.endedAt)));
}

/** Ends every other live session of the user; the number ended. */
export async function endOtherSessions(userId: string, keepSessionId: string): Promise<number> {
  const ended = await getDb().update(userSessions).set({ endedAt: sql`now()` })
    .where(and(eq(userSessions.userId, userId), ne(userSessions.id, keepSessionId), isNull(userSessions.endedAt), gt(userSessions.expiresAt, sql`now()`)))
    .returning({ id: userSessions.id });
  return ended.length;
}

export async function countLiveSessions(userId: string): Promise<number> {
  const rows = await getDb().select({ id: userSessions.id }).from(userSessions)
    .where(and(eq(userSessions.userId, userId), isNull(userSessions.endedAt), gt(userSessions.expiresAt, sql`now()`)));
  return rows.length;
}

/** Ends every session of the user at once (sign out everywhere). */
export async function bumpSessionVersion(userId: string): Promise<void> {
  await getDb().update(users).set({ sessionVersion: sql`${users.sessionVersion} + 1` }).where(eq(users.id, userId));
}
