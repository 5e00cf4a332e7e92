import { and, asc, desc, eq, inArray } from "drizzle-orm";
import { getDb } from "@/db/client";
import { organisations, ratings, unitEvents, units, users, type Unit } from "@/db/schema";
import { unitScopeWhere, type Scope } from "./scope";

type Disposition = Unit["disposition"];

/** Changes a unit's disposition and writes the audit row in one transaction. */
export async function recordDisposition(
  scope: Scope, unitId: string, actorId: string, to: Disposition, comment: string,
): Promise<"recorded" | "unchanged" | "out-of-scope"> {
  return getDb().transaction(async (tx) => {
    const [unit] = await tx.select({ id: units.id, disposition: units.disposition }).from(units)
      .where(and(unitScopeWhere(scope), eq(units.id, unitId))).for("update");
    if (!unit) return "out-of-scope";
    if (unit.disposition === to) return "unchanged";
    await tx.update(units).set({ disposition: to }).where(eq(units.id, unit.id));
    await tx.insert(unitEvents).values({ unitId: unit.id, actorId, kind: "disposition", fromDisposition: unit.disposition, toDisposition: to, comment });
    return "recorded";
  });
}

export async function listUnitEvents(scope: Scope, unitId: string) {
  return getDb()
    .select({ id: unitEvents.id, kind: unitEvents.kind, from: unitEvents.fromDisposition, to: unitEvents.toDisposition, comment: unitEvents.comment, at: unitEvents.createdAt, actor: users.name })
    .from(unitEvents)
    .innerJoin(units, eq(units.id, unitEvents.unitId))
    .innerJoin(users, eq(users.id, unitEvents.actorId))
    .where(and(unitScopeWhere(scope), eq(unitEvents.unitId, unitId)))
    .orderBy(desc(unitEvents.createdAt));
}

/** Units whose latest verdict is outside or near a band and that nobody has dispositioned yet. */
export async function listReviewQueue(scope: Scope) {
  return getDb()
    .select({ id: units.id, serial: units.serial, latestOverall: units.latestOverall, latestCaptureAt: units.latestCaptureAt, modelCode: ratings.modelCode, owner: organisations.name })
    .from(units)
    .innerJoin(ratings, eq(ratings.id, units.ratingId))
    .innerJoin(organisations, eq(organisations.id, units.organisationId))
    .where(and(unitScopeWhere(scope), inArray(units.latestOverall, ["fail", "marginal"]), eq(units.disposition, "open")))
    .orderBy(asc(units.latestOverall), asc(units.latestCaptureAt));
}
