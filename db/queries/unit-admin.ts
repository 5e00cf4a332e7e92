import { and, asc, eq, ilike, isNull, or, sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { organisations, ratings, unitEvents, units, type Unit } from "@/db/schema";
import type { Scope } from "./scope";

type LabScope = Scope & { kind: "lab" };

/** A rating this lab may register units against: its own, in force (not retired). */
async function ratingOfLab(scope: LabScope, ratingId: string) {
  const rows = await getDb().select().from(ratings).where(and(eq(ratings.id, ratingId), eq(ratings.labId, scope.labId), isNull(ratings.retiredAt))).limit(1);
  return rows[0];
}

export async function insertUnit(scope: LabScope, input: { serial: string; ratingId: string; actorId: string | null }): Promise<Unit | "no-rating" | "serial-taken"> {
  const rating = await ratingOfLab(scope, input.ratingId);
  if (!rating) return "no-rating";
  const inserted = await getDb().insert(units)
    .values({ serial: input.serial, ratingId: rating.id, organisationId: rating.organisationId, labId: scope.labId, createdById: input.actorId })
    .onConflictDoNothing({ target: [units.labId, units.serial] }).returning();
  return inserted[0] ?? "serial-taken";
}

/**
 * Changes a unit's serial or rating (its client follows the rating) and records before and after with the
 * reason in its history, in one transaction.
 */
export async function updateUnit(
  scope: LabScope, unitId: string, change: { serial?: string; ratingId?: string }, by: { actorId: string; reason: string },
): Promise<"updated" | "unchanged" | "missing" | "no-rating" | "serial-taken"> {
  return getDb().transaction(async (tx) => {
    const [unit] = await tx.select().from(units).where(and(eq(units.id, unitId), eq(units.labId, scope.labId))).for("update");
    if (!unit) return "missing";
    const detail: Record<string, [string, string]> = {};
    const set: Partial<Unit> = {};
    if (change.serial && change.serial !== unit.serial) {
      const [clash] = await tx.select({ id: units.id }).from(units).where(and(eq(units.labId, scope.labId), eq(units.serial, change.serial))).limit(1);
      if (clash) return "serial-taken";
      detail.serial = [unit.serial, change.serial];
      set.serial = change.serial;
    }
    if (change.ratingId && change.ratingId !== unit.ratingId) {
      const [rating] = await tx.select().from(ratings).where(and(eq(ratings.id, change.ratingId), eq(ratings.labId, scope.labId), isNull(ratings.retiredAt))).limit(1);
      if (!rating) return "no-rating";
      const [old] = await tx.select({ modelCode: ratings.modelCode, client: organisations.name }).from(ratings).innerJoin(organisations, eq(organisations.id, ratings.organisationId)).where(eq(ratings.id, unit.ratingId));
      const [client] = await tx.select({ name: organisations.name }).from(organisations).where(eq(organisations.id, rating.organisationId));
      detail.rating = [old?.modelCode ?? unit.ratingId, rating.modelCode];
      if (rating.organisationId !== unit.organisationId) detail.client = [old?.client ?? "", client?.name ?? ""];
      set.ratingId = rating.id;
      set.organisationId = rating.organisationId;
    }
    if (Object.keys(set).length === 0) return "unchanged";
    await tx.update(units).set(set).where(eq(units.id, unit.id));
    await tx.insert(unitEvents).values({ unitId: unit.id, actorId: by.actorId, kind: "edited", comment: by.reason, detail });
    return "updated";
  });
}

/** Retires (or restores) a unit registered by mistake; its captures and history stay. */
export async function setUnitRetired(scope: LabScope, unitId: string, retired: boolean, by: { actorId: string; reason: string }): Promise<boolean> {
  return getDb().transaction(async (tx) => {
    const rows = await tx.update(units).set({ retiredAt: retired ? new Date() : null })
      .where(and(eq(units.id, unitId), eq(units.labId, scope.labId), retired ? isNull(units.retiredAt) : sql`${units.retiredAt} is not null`)).returning({ id: units.id });
    if (rows.length === 0) return false;
    await tx.insert(unitEvents).values({ unitId, actorId: by.actorId, kind: retired ? "retired" : "restored", comment: by.reason });
    return true;
  });
}

/** Serials of the lab's units that look like `serial` (a cheap pre-filter; the caller ranks them). */
export async function listSerialsLike(scope: LabScope, serial: string, limit = 200): Promise<string[]> {
  const core = serial.replace(/[%_\\]/g, "").slice(0, 4);
  const rows = await getDb().select({ serial: units.serial }).from(units)
    .where(and(eq(units.labId, scope.labId), or(ilike(units.serial, `${core}%`), sql`length(${units.serial}) between ${serial.length - 2} and ${serial.length + 2}`)))
    .orderBy(asc(units.serial)).limit(limit);
  return rows.map((r) => r.serial);
}
