import { randomBytes } from "node:crypto";
import { and, asc, eq, isNull, sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { labClients, organisations, ratings, units, type Organisation } from "@/db/schema";
import type { Scope } from "./scope";

// Client organisations as a lab sees them: always through the lab_clients link.

type LabScope = Scope & { kind: "lab" };
export type ClientValues = { name: string; address: string; contactEmail: string; referenceCode: string };

const linked = (scope: LabScope) => and(eq(labClients.labId, scope.labId), eq(organisations.kind, "manufacturer"));

export async function listClientsForLab(scope: LabScope, options: { includeInactive?: boolean } = {}) {
  return getDb()
    .select({
      id: organisations.id, name: organisations.name, address: organisations.address, contactEmail: organisations.contactEmail,
      referenceCode: organisations.referenceCode, deactivatedAt: organisations.deactivatedAt, createdAt: organisations.createdAt,
      ratings: sql<number>`(select count(*) from ${ratings} where ${ratings.organisationId} = ${organisations.id} and ${ratings.labId} = ${scope.labId})`.mapWith(Number),
      units: sql<number>`(select count(*) from ${units} where ${units.organisationId} = ${organisations.id} and ${units.labId} = ${scope.labId})`.mapWith(Number),
    })
    .from(organisations)
    .innerJoin(labClients, eq(labClients.clientId, organisations.id))
    .where(options.includeInactive ? linked(scope) : and(linked(scope), isNull(organisations.deactivatedAt)))
    .orderBy(asc(organisations.name));
}

export async function getClientForLab(scope: LabScope, clientId: string): Promise<Organisation | undefined> {
  const rows = await getDb().select({ org: organisations }).from(organisations)
    .innerJoin(labClients, eq(labClients.clientId, organisations.id))
    .where(and(linked(scope), eq(organisations.id, clientId))).limit(1);
  return rows[0]?.org;
}

const slugOf = (name: string) => `${name.toLowerCase().replace(/[^a-z0-9]+/g, "-").replace(/^-|-$/g, "").slice(0, 40) || "client"}-${randomBytes(3).toString("hex")}`;

/** A new client organisation linked to the lab, in one transaction. */
export async function insertClientForLab(scope: LabScope, values: ClientValues): Promise<Organisation> {
  return getDb().transaction(async (tx) => {
    const [org] = await tx.insert(organisations).values({ ...values, kind: "manufacturer", slug: slugOf(values.name) }).returning();
    if (!org) throw new Error("client not stored");
    await tx.insert(labClients).values({ labId: scope.labId, clientId: org.id });
    return org;
  });
}

/** Updates a client linked to the lab; undefined when the client is not the lab's. */
export async function updateClientForLab(scope: LabScope, clientId: string, values: Partial<ClientValues> & { deactivatedAt?: Date | null }) {
  if (!(await getClientForLab(scope, clientId))) return undefined;
  const [row] = await getDb().update(organisations).set(values).where(and(eq(organisations.id, clientId), eq(organisations.kind, "manufacturer"))).returning();
  return row;
}

/** Whether another active client of the lab already has this name (case-insensitive). */
export async function clientNameTaken(scope: LabScope, name: string, exceptId?: string): Promise<boolean> {
  const rows = await getDb().select({ id: organisations.id }).from(organisations)
    .innerJoin(labClients, eq(labClients.clientId, organisations.id))
    .where(and(linked(scope), eq(sql`lower(${organisations.name})`, name.toLowerCase())));
  return rows.some((r) => r.id !== exceptId);
}
