import "server-only";
import { applyCaptureCorrection, listCaptureCorrections, planStepFitsCapture } from "@/db/queries/capture-corrections";
import { getCaptureDetail } from "@/db/queries/captures";
import { HttpError } from "@/lib/auth/guards";
import { captureCorrectionSchema, CORRECTABLE_FIELDS } from "@/lib/captures/input-schemas";
import { enqueueAnalysis } from "@/lib/server/queue";
import type { z } from "zod";
import type { Actor } from "./actor";
import { getCaptureStatusView, type CaptureStatusView } from "./captures";

type Correction = z.output<typeof captureCorrectionSchema>;

/** Lab managers, operators, quality engineers and station keys of the capture's lab may correct its settings. */
function requireCorrector(actor: Actor) {
  if (actor.scope.kind !== "lab" || !["admin", "operator", "qa", "station"].includes(actor.role)) {
    throw new HttpError(403, "Only the lab's operators, quality engineers and lab managers may correct a capture");
  }
  return actor.scope;
}

/**
 * Changes a capture's channel roles, probe ratios, offsets, speed, test kind or plan step, records who,
 * when and why, and analyses it again; the earlier result stays in its history.
 */
export async function correctCapture(actor: Actor, captureId: string, input: Correction): Promise<CaptureStatusView> {
  const scope = requireCorrector(actor);
  if (!(await getCaptureDetail(scope, captureId))) throw new HttpError(404, "No such capture");
  if (input.planStepId && !(await planStepFitsCapture(scope, captureId, [input.planStepId]))) {
    throw new HttpError(422, "planStepId: that step is not in the plan of this unit's rating");
  }
  const change = Object.fromEntries(CORRECTABLE_FIELDS.filter((k) => input[k] !== undefined).map((k) => [k, input[k]]));
  const outcome = await applyCaptureCorrection(scope, captureId, change, { actorId: actor.userId, stationKeyId: actor.stationKeyId, reason: input.reason });
  if (outcome === "missing") throw new HttpError(404, "No such capture");
  if (outcome === "busy") throw new HttpError(409, "The capture is still being uploaded or analysed: correct it once its analysis has finished");
  if (outcome === "unchanged") throw new HttpError(422, "These settings are the ones the capture already has: nothing to correct");
  // The row says queued; an enqueue lost now is picked up by the worker's sweep.
  await enqueueAnalysis({ captureId, labId: scope.labId }).catch((e: unknown) => console.error(`enqueue ${captureId}: ${String(e)}`));
  const view = await getCaptureStatusView(actor, captureId);
  if (!view) throw new HttpError(404, "No such capture");
  return view;
}

export async function getCaptureCorrections(actor: Actor, captureId: string) {
  return listCaptureCorrections(actor.scope, captureId);
}
