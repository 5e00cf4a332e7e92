import { and, asc, desc, eq, inArray, isNotNull, isNull, or, sql } from "drizzle-orm";
import { getDb } from "@/db/client";
import { organisations, ratings, signatures, unitAssignments, unitEvents, units, users, type Unit } from "@/db/schema";
import { decideDisposition, type DispositionChange } from "@/lib/units/disposition-rules";
import { unitScopeWhere, type Scope } from "./scope";

type Disposition = Unit["disposition"];

/** What the disposition rules need to know about a unit, or undefined when it is out of scope. */
export async function getDispositionFacts(scope: Scope, unitId: string) {
  const [row] = await getDb()
    .select({ id: units.id, disposition: units.disposition, planState: units.planState, latestOverall: units.latestOverall })
    .from(units).where(and(unitScopeWhere(scope), eq(units.id, unitId))).limit(1);
  return row;
}

export type DispositionWrite = DispositionChange & { actorId: string; expectedFrom: Disposition; signatureId: string | null };

/**
 * Changes a unit's disposition and writes the audit row in one transaction. The unit is locked and the
 * rules asked again, so a change that raced another (or a result that arrived meanwhile) is refused.
 */
export async function recordDisposition(scope: Scope, unitId: string, write: DispositionWrite): Promise<"recorded" | "changed-meanwhile" | "refused" | "out-of-scope"> {
  return getDb().transaction(async (tx) => {
    const [unit] = await tx.select({ id: units.id, disposition: units.disposition, planState: units.planState, latestOverall: units.latestOverall }).from(units)
      .where(and(unitScopeWhere(scope), eq(units.id, unitId))).for("update");
    if (!unit) return "out-of-scope";
    if (unit.disposition !== write.expectedFrom) return "changed-meanwhile";
    const decision = decideDisposition(unit, write);
    if (!decision.allowed || (decision.signature !== null) !== (write.signatureId !== null)) return "refused";
    await tx.update(units).set({ disposition: write.to }).where(eq(units.id, unit.id));
    await tx.insert(unitEvents).values({
      unitId: unit.id, actorId: write.actorId, kind: "disposition", fromDisposition: unit.disposition, toDisposition: write.to,
      comment: write.reason.trim(), concessionRef: write.concessionRef.trim() || null, signatureId: write.signatureId,
    });
    return "recorded";
  });
}

/** The unit's history with the signature given for each decision (name, role, time and meaning as signed). */
export async function listUnitEvents(scope: Scope, unitId: string) {
  return getDb()
    .select({
      id: unitEvents.id, kind: unitEvents.kind, from: unitEvents.fromDisposition, to: unitEvents.toDisposition, comment: unitEvents.comment,
      concessionRef: unitEvents.concessionRef, detail: unitEvents.detail, at: unitEvents.createdAt, actor: users.name,
      signerName: signatures.signerName, signerRole: signatures.signerRole, signedAt: signatures.signedAt, meaning: signatures.meaning,
    })
    .from(unitEvents)
    .innerJoin(units, eq(units.id, unitEvents.unitId))
    .innerJoin(users, eq(users.id, unitEvents.actorId))
    .leftJoin(signatures, eq(signatures.id, unitEvents.signatureId))
    .where(and(unitScopeWhere(scope), eq(unitEvents.unitId, unitId)))
    .orderBy(desc(unitEvents.createdAt));
}

/** Rank of a queue row: outside first (latest verdict or plan), then inconclusive, then near an edge. */
const queueRank = sql<number>`case
  when ${units.latestOverall} = 'fail' or ${units.planState} = 'failed' then 0
  when ${units.latestOverall} = 'inconclusive' or ${units.planState} = 'inconclusive' then 1
  when ${units.latestOverall} = 'marginal' then 2
  else 3 end`.mapWith(Number);

const reviewQueueWhere = (scope: Scope) => and(
  unitScopeWhere(scope), eq(units.disposition, "open"), isNull(units.retiredAt),
  or(isNotNull(units.latestOverall), inArray(units.planState, ["failed", "inconclusive"])),
);

/**
 * Open units with a judged capture, waiting for a disposition: outside first, then inconclusive, then
 * marginal, then the rest; within each, the oldest latest capture first. With who each is assigned to.
 * One page of them (a lab can have thousands waiting).
 */
export async function listReviewQueue(scope: Scope, page: { limit: number; offset: number } = { limit: 200, offset: 0 }) {
  const assignee = sql<string | null>`(select ${users.name} from ${users} where ${users.id} = ${unitAssignments.assigneeId})`;
  return getDb()
    .select({
      id: units.id, serial: units.serial, latestOverall: units.latestOverall, latestCaptureAt: units.latestCaptureAt, planState: units.planState,
      disposition: units.disposition, ratingId: units.ratingId, planStanding: units.planStanding, modelCode: ratings.modelCode, owner: organisations.name, rank: queueRank,
      assigneeId: unitAssignments.assigneeId, assignee,
    })
    .from(units)
    .innerJoin(ratings, eq(ratings.id, units.ratingId))
    .innerJoin(organisations, eq(organisations.id, units.organisationId))
    .leftJoin(unitAssignments, eq(unitAssignments.unitId, units.id))
    .where(reviewQueueWhere(scope))
    .orderBy(queueRank, asc(units.latestCaptureAt), asc(units.serial))
    .limit(page.limit)
    .offset(page.offset);
}

/** How many units wait for review, counted up to `cap` (the page says "more than" past it). */
export async function countReviewQueue(scope: Scope, cap: number): Promise<number> {
  const inner = getDb().select({ one: sql`1` }).from(units).where(reviewQueueWhere(scope)).limit(cap + 1).as("waiting");
  const [row] = await getDb().select({ n: sql<number>`count(*)`.mapWith(Number) }).from(inner);
  return row?.n ?? 0;
}
