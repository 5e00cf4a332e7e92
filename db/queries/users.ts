import { and, asc, eq, isNull, sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { organisations, users, type Role } from "@/db/schema";

export type SessionUserRow = {
  id: string; email: string; name: string; role: Role; organisationId: string;
  organisationName: string; organisationKind: "lab" | "manufacturer"; passwordHash: string;
};

export async function findActiveUserByEmail(email: string): Promise<SessionUserRow | undefined> {
  const rows = await getDb()
    .select({
      id: users.id, email: users.email, name: users.name, role: users.role, organisationId: users.organisationId,
      organisationName: organisations.name, organisationKind: organisations.kind, passwordHash: users.passwordHash,
    })
    .from(users)
    .innerJoin(organisations, eq(organisations.id, users.organisationId))
    .where(and(eq(sql`lower(${users.email})`, email.toLowerCase()), isNull(users.disabledAt)))
    .limit(1);
  return rows[0];
}

/** Every account, for the lab manager's user list. */
export async function listAllUsers() {
  return getDb()
    .select({ id: users.id, email: users.email, name: users.name, role: users.role, organisation: organisations.name, disabledAt: users.disabledAt })
    .from(users)
    .innerJoin(organisations, eq(organisations.id, users.organisationId))
    .orderBy(asc(organisations.name), asc(users.name));
}
