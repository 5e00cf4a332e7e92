import "server-only";
import { requeueFinishedCaptures } from "@/db/queries/captures";
import { HttpError } from "@/lib/auth/guards";
import { enqueueAnalysisOrLater } from "@/lib/server/queue";
import type { Actor } from "./actor";

/**
 * Queues a fresh analysis of one capture or of every capture of a rating. Only lab managers and
 * quality engineers (lab scope) may; the earlier results stay in each capture's history.
 */
export async function requestReanalysis(actor: Actor, target: { captureId: string } | { ratingId: string }) {
  if (actor.scope.kind !== "lab" || (actor.role !== "admin" && actor.role !== "qa")) throw new HttpError(403, "Only lab managers and quality engineers may re-run analyses");
  if ("ratingId" in target && actor.role !== "admin") throw new HttpError(403, "Only lab managers may re-run a whole rating");
  const rows = await requeueFinishedCaptures(actor.scope, target);
  if ("captureId" in target && rows.length === 0) throw new HttpError(409, "This capture is not finished yet, or does not exist");
  // The rows say queued; an enqueue lost now is picked up by the worker's sweep.
  await Promise.all(rows.map((r) => enqueueAnalysisOrLater(r)));
  return { queued: rows.length };
}
