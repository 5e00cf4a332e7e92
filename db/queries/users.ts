import { and, asc, eq, isNull, or, sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { organisations, users, type Role } from "@/db/schema";
import { linkedClientWhere } from "./scope";

export type SessionUserRow = {
  id: string; email: string; name: string; role: Role; organisationId: string;
  organisationName: string; organisationKind: "lab" | "manufacturer"; passwordHash: string; sessionVersion: number;
};

export async function findActiveUserByEmail(email: string): Promise<SessionUserRow | undefined> {
  const rows = await getDb()
    .select({
      id: users.id, email: users.email, name: users.name, role: users.role, organisationId: users.organisationId,
      organisationName: organisations.name, organisationKind: organisations.kind, passwordHash: users.passwordHash,
      sessionVersion: users.sessionVersion,
    })
    .from(users)
    .innerJoin(organisations, eq(organisations.id, users.organisationId))
    .where(and(eq(sql`lower(${users.email})`, email.toLowerCase()), isNull(users.disabledAt)))
    .limit(1);
  return rows[0];
}

/** The account behind a session or a trusted script, with its organisation; undefined when gone or disabled. */
export async function findActiveUserById(userId: string): Promise<Omit<SessionUserRow, "passwordHash" | "sessionVersion"> | undefined> {
  const rows = await getDb()
    .select({
      id: users.id, email: users.email, name: users.name, role: users.role, organisationId: users.organisationId,
      organisationName: organisations.name, organisationKind: organisations.kind,
    })
    .from(users)
    .innerJoin(organisations, eq(organisations.id, users.organisationId))
    .where(and(eq(users.id, userId), isNull(users.disabledAt)))
    .limit(1);
  return rows[0];
}

/** Accounts a lab manager administers: the lab's own staff and the users of the clients it is linked to. */
export async function listUsersForAdmin(labId: string) {
  return getDb()
    .select({ id: users.id, email: users.email, name: users.name, role: users.role, organisation: organisations.name, disabledAt: users.disabledAt })
    .from(users)
    .innerJoin(organisations, eq(organisations.id, users.organisationId))
    .where(or(eq(organisations.id, labId), and(eq(organisations.kind, "manufacturer"), linkedClientWhere(labId, organisations.id))))
    .orderBy(asc(organisations.name), asc(users.name));
}

export async function listOrganisations() {
  return getDb().select().from(organisations).orderBy(asc(organisations.kind), asc(organisations.name));
}

/** The lab itself and the client organisations it is linked to: where its manager may invite people. */
export async function listOrganisationsForLab(labId: string) {
  return getDb().select().from(organisations)
    .where(or(eq(organisations.id, labId), and(eq(organisations.kind, "manufacturer"), linkedClientWhere(labId, organisations.id))))
    .orderBy(asc(organisations.kind), asc(organisations.name));
}

export async function insertUser(values: { email: string; name: string; role: Role; organisationId: string; passwordHash: string }) {
  const [row] = await getDb().insert(users).values({ ...values, email: values.email.toLowerCase() }).returning({ id: users.id });
  return row;
}

export async function findUserIdByEmail(email: string) {
  const rows = await getDb().select({ id: users.id, name: users.name, organisationId: users.organisationId }).from(users)
    .where(and(eq(sql`lower(${users.email})`, email.toLowerCase()), isNull(users.disabledAt))).limit(1);
  return rows[0];
}

/** Disabling (or re-enabling) also ends every session the account had. */
export async function setUserDisabled(userId: string, disabled: boolean) {
  await getDb().update(users)
    .set({ disabledAt: disabled ? new Date() : null, sessionVersion: sql`${users.sessionVersion} + 1` })
    .where(eq(users.id, userId));
}

/** A role change ends every session, so the new role applies from the next sign-in. */
export async function setUserRole(userId: string, role: Role) {
  await getDb().update(users).set({ role, sessionVersion: sql`${users.sessionVersion} + 1` }).where(eq(users.id, userId));
}
