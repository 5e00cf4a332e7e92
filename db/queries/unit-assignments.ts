import { and, eq, inArray, isNull } from "drizzle-orm";
import { getDb } from "@/db/client";
import { unitAssignments, unitEvents, units, users } from "@/db/schema";
import { unitScopeWhere, type Scope } from "./scope";

type LabScope = Scope & { kind: "lab" };

/** Quality engineers and lab managers of the lab who can be given units to review (enabled accounts). */
export async function listReviewers(scope: LabScope) {
  return getDb().select({ id: users.id, name: users.name }).from(users)
    .where(and(eq(users.organisationId, scope.labId), inArray(users.role, ["qa", "admin"]), isNull(users.disabledAt)))
    .orderBy(users.name);
}

/**
 * Assigns these units of the lab to a quality engineer or lab manager of the lab (replacing any earlier assignment) and
 * notes it in each unit's history. Returns how many units were assigned; units of other labs are skipped.
 */
export async function assignUnits(scope: LabScope, unitIds: readonly string[], assigneeId: string, assignedById: string): Promise<number | "no-assignee"> {
  return getDb().transaction(async (tx) => {
    const [assignee] = await tx.select({ id: users.id, name: users.name }).from(users)
      .where(and(eq(users.id, assigneeId), eq(users.organisationId, scope.labId), inArray(users.role, ["qa", "admin"]), isNull(users.disabledAt))).limit(1);
    if (!assignee) return "no-assignee";
    const own = await tx.select({ id: units.id }).from(units).where(and(unitScopeWhere(scope), inArray(units.id, [...unitIds])));
    for (const { id } of own) {
      await tx.insert(unitAssignments).values({ unitId: id, assigneeId, assignedById })
        .onConflictDoUpdate({ target: unitAssignments.unitId, set: { assigneeId, assignedById, assignedAt: new Date() } });
      await tx.insert(unitEvents).values({ unitId: id, actorId: assignedById, kind: "assigned", detail: { assigneeId, assignee: assignee.name } });
    }
    return own.length;
  });
}
