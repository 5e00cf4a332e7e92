import "server-only";
import { z } from "zod";
import { listActivePlanSteps } from "@/db/queries/judgement";
import { listLatestVerdicts, listVerdictsOfCaptures } from "@/db/queries/review-checks";
import { assignUnits, listReviewers } from "@/db/queries/unit-assignments";
import { countReviewQueue, listReviewQueue, listUnitEvents } from "@/db/queries/unit-events";
import { refreshUnitPlanState } from "@/db/queries/unit-plan";
import type { StoredStepStanding } from "@/db/schema";
import { HttpError } from "@/lib/auth/guards";
import { findingsOf, type CheckFinding, type JudgedCheck } from "@/lib/units/check-exceedance";
import { requirePageActor, type Actor } from "./actor";

type LabScope = Actor["scope"] & { kind: "lab" };

/** The review queue is for lab managers and quality engineers (403 for anyone else). */
function requireReviewer(actor: Actor): { scope: LabScope; userId: string } {
  if (actor.scope.kind !== "lab" || actor.role === "station" || !actor.userId || (actor.role !== "qa" && actor.role !== "admin")) {
    throw new HttpError(403, "The review queue is for quality engineers and lab managers.");
  }
  return { scope: actor.scope, userId: actor.userId };
}

/** The stored standing covers exactly the rating's active steps. */
function sameSteps(standing: readonly StoredStepStanding[], steps: readonly { id: string }[]): boolean {
  return standing.length === steps.length && steps.every((s) => standing.some((x) => x.stepId === s.id));
}

export type QueueFinding = CheckFinding & { step: string | null };

/** Units per page of the review queue, and how far its count goes before it says "more than". */
export const REVIEW_PAGE_SIZE = 50;
export const REVIEW_COUNT_CAP = 10_000;
export const reviewPageSchema = z.coerce.number().int().min(1).max(1000).catch(1);

/**
 * One page of the open units waiting for a disposition, outside first then oldest (the order of
 * listReviewQueue), each with the failing or inconclusive checks of its plan records (or of its latest
 * capture where the rating has no plan), the plan steps still missing and who it is assigned to.
 */
export async function getReviewQueueView(actor: Actor, page = 1) {
  const { scope, userId } = requireReviewer(actor);
  const [rows, reviewers, waiting] = await Promise.all([
    listReviewQueue(scope, { limit: REVIEW_PAGE_SIZE + 1, offset: (page - 1) * REVIEW_PAGE_SIZE }), listReviewers(scope), countReviewQueue(scope, REVIEW_COUNT_CAP),
  ]);
  const shown = rows.slice(0, REVIEW_PAGE_SIZE);
  const ratingIds = [...new Set(shown.map((r) => r.ratingId))];
  const stepsOf = new Map(await Promise.all(ratingIds.map(async (id) => [id, await listActivePlanSteps(id)] as const)));
  // The standing stored with each unit's plan state; evaluated (and stored) where it is missing or
  // does not cover the rating's active steps, so the queue never shows a stale plan.
  const evaluated = await Promise.all(shown.map(async (row) => {
    const steps = stepsOf.get(row.ratingId) ?? [];
    const fresh = row.planStanding && sameSteps(row.planStanding, steps) ? row.planStanding : await refreshUnitPlanState(scope, row.id, { ratingId: row.ratingId, steps });
    return { row, standing: fresh ?? [], steps };
  }));
  // Verdicts of just the captures shown: the records of failing or inconclusive steps, else the latest.
  const recordIds = evaluated.flatMap(({ standing, steps }) => (steps.length === 0 ? [] : standing
    .filter((s) => s.status === "failed" || s.status === "inconclusive").flatMap((s) => (s.recordCaptureId ? [s.recordCaptureId] : []))));
  const planless = evaluated.filter((e) => e.steps.length === 0).map((e) => e.row.id);
  const [recorded, latest] = await Promise.all([listVerdictsOfCaptures(scope, recordIds), listLatestVerdicts(scope, planless)]);
  const verdicts = [...recorded, ...latest];
  const units = evaluated.map(({ row, standing, steps }) => {
    const stepName = new Map(steps.map((s) => [s.id, s.name]));
    const sources = verdicts.filter((v) => v.unitId === row.id);
    const findings: QueueFinding[] = sources.flatMap((v) => {
      const checks = Array.isArray(v.verdicts) ? (v.verdicts as JudgedCheck[]) : [];
      return findingsOf(checks).map((f) => ({ ...f, step: v.planStepId ? stepName.get(v.planStepId) ?? null : null }));
    });
    const missingSteps = standing.filter((s) => s.status === "missing").map((s) => stepName.get(s.stepId) ?? "a plan step");
    const { planStanding: _standing, ratingId: _rating, ...shownRow } = row;
    return { ...shownRow, findings, missingSteps, mine: row.assigneeId === userId };
  });
  return { units, reviewers, me: userId, page, hasMore: rows.length > REVIEW_PAGE_SIZE, waiting, waitingCapped: waiting > REVIEW_COUNT_CAP };
}

export const assignSchema = z.object({
  unitIds: z.array(z.uuid("Pick units from the list")).min(1, "Tick at least one unit").max(200, "At most 200 units at once"),
  assigneeId: z.uuid("Pick who reviews the units"),
});

/** Gives units to a quality engineer of the lab ("take" is assigning to oneself). Returns how many were assigned. */
export async function assignForReview(actor: Actor, input: z.output<typeof assignSchema>): Promise<number> {
  const { scope, userId } = requireReviewer(actor);
  const outcome = await assignUnits(scope, [...new Set(input.unitIds)], input.assigneeId, userId);
  if (outcome === "no-assignee") throw new HttpError(422, "Units can be assigned only to an enabled quality engineer or lab manager of your lab.");
  if (outcome === 0) throw new HttpError(404, "None of those units is one your lab tests.");
  return outcome;
}

export type HistoryEvent = {
  id: string; kind: string; from: string | null; to: string | null; at: Date;
  /** Staff-only fields: null for a client. */
  actor: string | null; comment: string | null;
  concessionRef: string | null;
  signature: { name: string | null; role: string; at: Date; meaning: string } | null;
  detail: string | null;
};

/**
 * The unit's history. Lab staff see everything; a client sees only the disposition decisions with their
 * concession reference and the signer's role and meaning, never staff names, comments or other events.
 */
export async function getUnitHistoryView(unitId: string): Promise<{ events: HistoryEvent[]; canDisposition: boolean }> {
  const actor = await requirePageActor();
  const events = await unitHistoryFor(actor, unitId);
  return { events, canDisposition: actor.scope.kind === "lab" && (actor.role === "qa" || actor.role === "admin") };
}

/** The same history for any authorised caller (a client's API token included): a client gets the reduced view. */
export async function unitHistoryFor(actor: Actor, unitId: string): Promise<HistoryEvent[]> {
  if (!z.uuid().safeParse(unitId).success) return [];
  const rows = await listUnitEvents(actor.scope, unitId);
  const client = actor.scope.kind !== "lab";
  return rows
    .filter((e) => !client || e.kind === "disposition")
    .map((e): HistoryEvent => ({
      id: e.id, kind: e.kind, from: e.from, to: e.to, at: e.at, concessionRef: e.concessionRef,
      actor: client ? null : e.actor, comment: client ? null : e.comment,
      signature: e.signedAt && e.signerRole && e.meaning ? { name: client ? null : e.signerName, role: e.signerRole, at: e.signedAt, meaning: e.meaning } : null,
      detail: client ? null : typeof e.detail?.assignee === "string" ? e.detail.assignee : null,
    }));
}
