import { and, eq, gt, isNull, sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { passwordTokens, users, type PasswordToken } from "@/db/schema";

export async function insertPasswordToken(userId: string, purpose: PasswordToken["purpose"], tokenHash: string, ttlS: number) {
  await getDb().insert(passwordTokens).values({ userId, purpose, tokenHash, expiresAt: new Date(Date.now() + ttlS * 1000) });
}

export async function findUsablePasswordToken(tokenHash: string) {
  const rows = await getDb()
    .select({ id: passwordTokens.id, purpose: passwordTokens.purpose, email: users.email, name: users.name })
    .from(passwordTokens)
    .innerJoin(users, eq(users.id, passwordTokens.userId))
    .where(and(eq(passwordTokens.tokenHash, tokenHash), isNull(passwordTokens.usedAt), gt(passwordTokens.expiresAt, new Date()), isNull(users.disabledAt)))
    .limit(1);
  return rows[0];
}

/**
 * Marks the token used and sets the password in one transaction; false when the token is gone. Every
 * other link of the user ends with it, and so does every session (session_version + 1).
 */
export async function consumeTokenAndSetPassword(tokenHash: string, passwordHash: string): Promise<boolean> {
  return getDb().transaction(async (tx) => {
    const [token] = await tx
      .update(passwordTokens)
      .set({ usedAt: new Date() })
      .where(and(eq(passwordTokens.tokenHash, tokenHash), isNull(passwordTokens.usedAt), gt(passwordTokens.expiresAt, new Date())))
      .returning({ userId: passwordTokens.userId });
    if (!token) return false;
    await tx.update(passwordTokens).set({ usedAt: new Date() }).where(and(eq(passwordTokens.userId, token.userId), isNull(passwordTokens.usedAt)));
    await tx.update(users).set({ passwordHash, sessionVersion: sql`${users.sessionVersion} + 1` }).where(eq(users.id, token.userId));
    return true;
  });
}

export async function countRecentTokens(userId: string, purpose: PasswordToken["purpose"], windowS: number): Promise<number> {
  const rows = await getDb()
    .select({ id: passwordTokens.id })
    .from(passwordTokens)
    .where(and(eq(passwordTokens.userId, userId), eq(passwordTokens.purpose, purpose), gt(passwordTokens.createdAt, new Date(Date.now() - windowS * 1000))));
  return rows.length;
}
