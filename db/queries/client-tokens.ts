import { and, desc, eq, isNull } from "drizzle-orm";
import { getDb } from "@/db/client";
import { clientAdmins, clientTokens, users } from "@/db/schema";

export async function isActiveClientAdmin(userId: string): Promise<boolean> {
  const rows = await getDb().select({ active: clientAdmins.active }).from(clientAdmins).where(eq(clientAdmins.userId, userId)).limit(1);
  return rows[0]?.active === true;
}

export async function setClientAdmin(userId: string, grantedById: string, active: boolean): Promise<void> {
  await getDb().insert(clientAdmins).values({ userId, grantedById, active })
    .onConflictDoUpdate({ target: clientAdmins.userId, set: { active, grantedById } });
}

export async function listClientAdminIds(userIds: readonly string[]): Promise<Set<string>> {
  if (userIds.length === 0) return new Set();
  const rows = await getDb().select({ userId: clientAdmins.userId }).from(clientAdmins).where(eq(clientAdmins.active, true));
  return new Set(rows.map((r) => r.userId).filter((id) => userIds.includes(id)));
}

export async function listClientTokens(organisationId: string) {
  return getDb()
    .select({
      id: clientTokens.id, label: clientTokens.label, prefix: clientTokens.prefix, userName: users.name, expiresAt: clientTokens.expiresAt,
      revokedAt: clientTokens.revokedAt, lastUsedAt: clientTokens.lastUsedAt, createdAt: clientTokens.createdAt,
    })
    .from(clientTokens).innerJoin(users, eq(users.id, clientTokens.userId))
    .where(eq(clientTokens.organisationId, organisationId))
    .orderBy(desc(clientTokens.createdAt));
}

export async function insertClientToken(values: { organisationId: string; userId: string; label: string; prefix: string; secretHash: string; expiresAt: Date }) {
  const rows = await getDb().insert(clientTokens).values(values).returning({ id: clientTokens.id });
  return rows[0];
}

/** Revokes a live token of the organisation; false when there is no such token. */
export async function revokeClientToken(organisationId: string, tokenId: string): Promise<boolean> {
  const rows = await getDb().update(clientTokens).set({ revokedAt: new Date() })
    .where(and(eq(clientTokens.id, tokenId), eq(clientTokens.organisationId, organisationId), isNull(clientTokens.revokedAt)))
    .returning({ id: clientTokens.id });
  return rows.length > 0;
}

/** For API authentication: the token by its prefix, with its owner's account state. */
export async function findClientTokenByPrefix(prefix: string) {
  const rows = await getDb()
    .select({ token: clientTokens, userDisabledAt: users.disabledAt, userOrganisationId: users.organisationId })
    .from(clientTokens).innerJoin(users, eq(users.id, clientTokens.userId))
    .where(eq(clientTokens.prefix, prefix)).limit(1);
  return rows[0];
}

export async function touchClientToken(id: string): Promise<void> {
  await getDb().update(clientTokens).set({ lastUsedAt: new Date() }).where(eq(clientTokens.id, id));
}
