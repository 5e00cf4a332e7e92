import { and, desc, eq } from "drizzle-orm";
import { getDb } from "@/db/client";
import { unitNotes, units, users } from "@/db/schema";
import { unitScopeWhere, type Scope } from "./scope";

export type NoteVisibility = "internal" | "client";

/** A note on a unit of the lab's own; undefined when the unit is not the lab's. */
export async function insertUnitNote(scope: Scope & { kind: "lab" }, values: { unitId: string; authorId: string; visibility: NoteVisibility; body: string }) {
  return getDb().transaction(async (tx) => {
    const [unit] = await tx.select({ id: units.id }).from(units).where(and(unitScopeWhere(scope), eq(units.id, values.unitId))).limit(1);
    if (!unit) return undefined;
    const [row] = await tx.insert(unitNotes).values(values).returning();
    return row;
  });
}

/**
 * The unit's notes, newest first. A client's scope gets only notes written for the client, and never
 * the author: the filter is in the query, so an internal note does not leave the database for a client.
 */
export async function listUnitNotes(scope: Scope, unitId: string) {
  const where = and(unitScopeWhere(scope), eq(unitNotes.unitId, unitId), scope.kind === "manufacturer" ? eq(unitNotes.visibility, "client") : undefined);
  const rows = await getDb()
    .select({ id: unitNotes.id, visibility: unitNotes.visibility, body: unitNotes.body, createdAt: unitNotes.createdAt, author: users.name })
    .from(unitNotes)
    .innerJoin(units, eq(units.id, unitNotes.unitId))
    .innerJoin(users, eq(users.id, unitNotes.authorId))
    .where(where)
    .orderBy(desc(unitNotes.createdAt))
    .limit(500);
  return scope.kind === "manufacturer" ? rows.map((r) => ({ ...r, author: null })) : rows;
}
