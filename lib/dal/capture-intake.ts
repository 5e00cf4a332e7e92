import "server-only";
import { randomUUID } from "node:crypto";
import { getCaptureDetail, insertCaptureOnce, markCaptureQueued, setCaptureState, setCaptureUpload, touchUploadingCapture } from "@/db/queries/captures";
import { getStation } from "@/db/queries/stations";
import { getRatingForRegistration, getUnitBySerial, insertUnitOnce } from "@/db/queries/units";
import type { Capture } from "@/db/schema";
import { CaptureRejection, sniffCaptureHeader } from "@/lib/analysis";
import { HttpError } from "@/lib/auth/guards";
import { captureRegistrationSchema, type completeUploadSchema, type UploadPlan } from "@/lib/captures/input-schemas";
import { getEnv } from "@/lib/server/env";
import { enqueueAnalysis } from "@/lib/server/queue";
import {
  captureObjectKey, completeMultipartUpload, createMultipartUpload, deleteIncompleteObject, headObject, MULTIPART_THRESHOLD_BYTES,
  partCountFor, partSizeFor, presignParts, presignSinglePut, readObjectHead, UPLOAD_URL_TTL_S,
} from "@/lib/server/storage";
import type { z } from "zod";
import { requireUploader, type Actor } from "./actor";
import { getCaptureStatusView, type CaptureStatusView } from "./captures";
import { readJson } from "./request";

type Registration = z.output<typeof captureRegistrationSchema>;
type Completion = z.output<typeof completeUploadSchema>;
const HEADER_PROBE_BYTES = 64 * 1024;
const mib = (bytes: number) => `${(bytes / 1024 ** 2).toFixed(1)} MiB`;

async function resolveUnit(scope: Actor["scope"] & { kind: "lab" }, input: Registration) {
  const known = await getUnitBySerial(scope, input.unitSerial);
  if (known?.unit.retiredAt) throw new HttpError(422, `Unit ${input.unitSerial} was retired (registered by mistake): use the unit's correct serial`);
  if (known) return known.unit;
  if (!input.newUnitRatingId) throw new HttpError(422, `No unit with serial ${input.unitSerial} in this lab: register it with its rating first`);
  const rating = await getRatingForRegistration(scope, input.newUnitRatingId);
  if (!rating) throw new HttpError(422, "Unknown rating: pick one of the ratings on file");
  return insertUnitOnce(scope, { serial: input.unitSerial, ratingId: rating.id, organisationId: rating.organisationId });
}

async function planUpload(scope: Actor["scope"], capture: Capture): Promise<UploadPlan> {
  if (capture.sizeBytes <= MULTIPART_THRESHOLD_BYTES) {
    await setCaptureUpload(scope, capture.id, { objectKey: capture.objectKey, multipartUploadId: null });
    const url = await presignSinglePut(capture.objectKey, capture.sizeBytes);
    return { kind: "single", method: "PUT", url, headers: { "Content-Type": "text/csv" }, expiresInS: UPLOAD_URL_TTL_S };
  }
  const uploadId = await createMultipartUpload(capture.objectKey);
  await setCaptureUpload(scope, capture.id, { objectKey: capture.objectKey, multipartUploadId: uploadId });
  const numbers = Array.from({ length: partCountFor(capture.sizeBytes) }, (_, i) => i + 1);
  return { kind: "multipart", partSize: partSizeFor(capture.sizeBytes), parts: await presignParts(capture.objectKey, uploadId, numbers), expiresInS: UPLOAD_URL_TTL_S };
}

/**
 * Registers a capture and returns where to upload it. The same file (sha256) for the same unit
 * returns the capture already stored; only one still uploading gets fresh upload URLs.
 */
export async function registerCapture(actor: Actor, input: Registration): Promise<{ capture: CaptureStatusView; duplicate: boolean; upload: UploadPlan | null }> {
  const scope = requireUploader(actor);
  const limit = getEnv().UPLOAD_MAX_BYTES;
  if (input.sizeBytes > limit) throw new HttpError(413, `The file is ${mib(input.sizeBytes)}: the limit is ${mib(limit)}`);
  const stationId = actor.stationId ?? input.stationId ?? null;
  if (input.stationId && !actor.stationId && !(await getStation(scope, input.stationId))) throw new HttpError(422, "Unknown bench for this lab");
  const unit = await resolveUnit(scope, input);
  const id = randomUUID();
  const { capture, duplicate } = await insertCaptureOnce({
    id, unitId: unit.id, labId: scope.labId, stationId, uploadedById: actor.userId, stationKeyId: actor.stationKeyId,
    testKind: input.testKind, speedRpm: input.speedRpm ?? null, channelRoles: input.channelRoles, probeScales: input.probeScales,
    notes: input.notes, originalName: input.fileName, objectKey: captureObjectKey(scope.labId, unit.id, id),
    sizeBytes: input.sizeBytes, sha256: input.sha256,
  });
  if (duplicate && capture.sizeBytes !== input.sizeBytes) throw new HttpError(409, "A capture with this sha256 but another size exists for this unit");
  const upload = capture.state === "uploading" ? await planUpload(scope, capture) : null;
  const view = await getCaptureStatusView(actor, capture.id);
  if (!view) throw new Error("a capture just stored could not be read back");
  return { capture: view, duplicate, upload };
}

export async function presignCaptureParts(actor: Actor, captureId: string, partNumbers: number[]) {
  const scope = requireUploader(actor);
  const found = await getCaptureDetail(scope, captureId);
  if (!found) throw new HttpError(404, "No such capture");
  const { capture } = found;
  if (capture.state !== "uploading" || !capture.multipartUploadId) throw new HttpError(409, "This capture is not awaiting a multipart upload");
  const count = partCountFor(capture.sizeBytes);
  if (partNumbers.some((n) => n > count)) throw new HttpError(400, `This upload has ${count} parts`);
  await touchUploadingCapture(scope, capture.id);
  return presignParts(capture.objectKey, capture.multipartUploadId, partNumbers);
}

/** Refuses the upload and keeps nothing that could pass for a capture. */
async function refuse(scope: Actor["scope"], capture: Capture, status: number, message: string, keepRow: boolean): Promise<never> {
  await deleteIncompleteObject(capture.objectKey).catch(() => undefined);
  if (!keepRow) await setCaptureState(scope, capture.id, "rejected", ["uploading"], { stateMessage: message });
  throw new HttpError(status, message);
}

/**
 * Closes the upload: assembles multipart parts, checks the stored size and the header row, then
 * queues the analysis. Completing twice answers with the capture as it is.
 */
export async function completeCaptureUpload(actor: Actor, captureId: string, input: Completion): Promise<CaptureStatusView> {
  const scope = requireUploader(actor);
  const found = await getCaptureDetail(scope, captureId);
  if (!found) throw new HttpError(404, "No such capture");
  const { capture } = found;
  if (capture.state === "uploading") {
    // Marks the upload active, so the abandoned-upload sweep leaves it while it is being closed.
    if (!(await touchUploadingCapture(scope, capture.id))) throw new HttpError(404, "No such capture (an upload not completed in time is removed)");
    if (capture.multipartUploadId) {
      const expected = partCountFor(capture.sizeBytes);
      if (!input.parts || input.parts.length !== expected) throw new HttpError(400, `Send the ETag of each of the ${expected} parts`);
      try {
        await completeMultipartUpload(capture.objectKey, capture.multipartUploadId, input.parts);
      } catch (err) {
        throw new HttpError(400, `The object store refused to assemble the parts: ${err instanceof Error ? err.message : String(err)}`);
      }
    }
    const stored = await headObject(capture.objectKey);
    if (!stored) throw new HttpError(409, "Nothing has been uploaded for this capture yet");
    if (stored.sizeBytes !== capture.sizeBytes) {
      await refuse(scope, capture, 400, `The uploaded file has ${stored.sizeBytes} bytes, but ${capture.sizeBytes} were registered: upload it again`, true);
    }
    const head = await readObjectHead(capture.objectKey, Math.min(HEADER_PROBE_BYTES, capture.sizeBytes));
    if (head.includes(0)) await refuse(scope, capture, 415, "The file holds binary data, not CSV text", false);
    try {
      sniffCaptureHeader(new TextDecoder().decode(head));
    } catch (err) {
      if (!(err instanceof CaptureRejection)) throw err;
      await refuse(scope, capture, 422, err.message, false);
    }
    const queued = await markCaptureQueued(scope, capture.id, stored.etag);
    // Read before enqueueing, so the answer says what completion did (queued), not how far a fast worker got.
    const view = await getCaptureStatusView(actor, capture.id);
    // The row says queued either way; if Redis is unreachable now, the worker's sweep enqueues it later.
    if (queued) await enqueueAnalysis({ captureId: capture.id, labId: capture.labId }).catch((e: unknown) => console.error(`enqueue ${capture.id}: ${String(e)}`));
    if (view) return view;
  }
  const view = await getCaptureStatusView(actor, capture.id);
  if (!view) throw new HttpError(404, "No such capture");
  return view;
}

/** The JSON answer of POST /api/captures and POST /api/v1/captures: 201 for a new capture, 200 for the one already stored. */
export async function captureRegistrationResponse(actor: Actor, request: Request): Promise<Response> {
  const result = await registerCapture(actor, await readJson(request, captureRegistrationSchema));
  return Response.json(result, { status: result.duplicate ? 200 : 201 });
}
