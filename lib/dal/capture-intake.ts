import "server-only";
import { randomUUID } from "node:crypto";
import {
  deleteUploadingCapture, getCaptureDetail, insertCaptureOnce, markCaptureQueued, setCaptureUpload, takeOverIdleUpload, touchUploadingCapture,
} from "@/db/queries/captures";
import { getStation } from "@/db/queries/stations";
import { listSerialsLike } from "@/db/queries/unit-admin";
import { getRatingForRegistration, getUnitBySerial, insertUnitOnce } from "@/db/queries/units";
import { similarSerials } from "@/lib/units/similar-serials";
import type { Capture } from "@/db/schema";
import { CaptureRejection, sniffCaptureBytes, type SniffedHeader } from "@/lib/analysis";
import { HttpError } from "@/lib/auth/guards";
import { captureRegistrationSchema, type completeUploadSchema, type PartUrl, type UploadPlan } from "@/lib/captures/input-schemas";
import { getEnv } from "@/lib/server/env";
import { isConnectionFailure } from "@/lib/server/outage";
import { enqueueAnalysisOrLater } from "@/lib/server/queue";
import {
  abortMultipartUpload, captureObjectKey, completeMultipartUpload, createMultipartUpload, deleteIncompleteObject, headObject, MULTIPART_THRESHOLD_BYTES,
  partCountFor, partSizeFor, presignParts, presignSinglePut, readObjectHead, sha256Base64, UPLOAD_URL_TTL_S,
} from "@/lib/server/storage";
import type { z } from "zod";
import { requireUploader, type Actor } from "./actor";
import { recordRegistrationInstruments, resolveRegistrationInstruments } from "./capture-instruments";
import { getCaptureStatusView, type CaptureStatusView } from "./captures";
import { rememberOrApplyProfile } from "./import-profiles";
import { readJson } from "./request";

type Registration = z.output<typeof captureRegistrationSchema>;
type Completion = z.output<typeof completeUploadSchema>;
const HEADER_PROBE_BYTES = 64 * 1024;
/**
 * One upload in progress per capture: while its upload URLs were issued or used (parts asked for,
 * completion started) within this many seconds, registering the same file again answers 409
 * "upload in progress" with Retry-After; after that the new registration takes the upload over.
 */
export const UPLOAD_LEASE_S = 60;
const mib = (bytes: number) => `${(bytes / 1024 ** 2).toFixed(1)} MiB`;

async function resolveUnit(scope: Actor["scope"] & { kind: "lab" }, input: Registration) {
  const known = await getUnitBySerial(scope, input.unitSerial);
  if (known?.unit.retiredAt) throw new HttpError(422, `Unit ${input.unitSerial} was retired (registered by mistake): use the unit's correct serial`);
  if (known) return known.unit;
  if (!input.newUnitRatingId) throw new HttpError(422, `No unit with serial ${input.unitSerial} in this lab: register it with its rating first`);
  const rating = await getRatingForRegistration(scope, input.newUnitRatingId);
  if (!rating) throw new HttpError(422, "Unknown rating: pick one of the ratings on file");
  if (input.confirmNewUnit !== true) {
    const close = similarSerials(input.unitSerial, await listSerialsLike(scope, input.unitSerial));
    throw new HttpError(422, `${input.unitSerial} is not on file${close.length ? ` (close matches: ${close.join(", ")})` : ""}: confirm it is a new unit (confirmNewUnit: true) or correct the serial`);
  }
  return insertUnitOnce(scope, { serial: input.unitSerial, ratingId: rating.id, organisationId: rating.organisationId });
}

async function planUpload(scope: Actor["scope"], capture: Capture): Promise<UploadPlan> {
  if (capture.sizeBytes <= MULTIPART_THRESHOLD_BYTES) {
    await setCaptureUpload(scope, capture.id, { objectKey: capture.objectKey, multipartUploadId: null });
    const { url, headers } = await presignSinglePut(capture.objectKey, capture.sizeBytes, capture.sha256);
    return { kind: "single", method: "PUT", url, headers, expiresInS: UPLOAD_URL_TTL_S };
  }
  const uploadId = await createMultipartUpload(capture.objectKey);
  await setCaptureUpload(scope, capture.id, { objectKey: capture.objectKey, multipartUploadId: uploadId });
  // Part URLs follow from the parts endpoint, once the client has each part's sha256 to bind them to.
  return { kind: "multipart", partSize: partSizeFor(capture.sizeBytes), partCount: partCountFor(capture.sizeBytes), expiresInS: UPLOAD_URL_TTL_S };
}

/**
 * Registers a capture and returns where to upload it. The same file (sha256) for the same unit
 * returns the capture already stored; one still uploading answers 409 while its upload is in
 * progress (see UPLOAD_LEASE_S) and is taken over with fresh upload URLs once it is idle.
 * A registration that fails half-way (the object store unreachable) leaves no row behind.
 */
/**
 * Settings of a re-sent file that differ from those stored with its capture: { field: [stored, sent] }.
 * Only fields the sender gave count (empty roles or ratios mean "as before").
 */
function differingSettings(capture: Capture, input: Registration): Record<string, [unknown, unknown]> | null {
  const sent: Record<string, unknown> = { testKind: input.testKind };
  if (input.speedRpm !== undefined && input.speedRpm !== null) sent.speedRpm = input.speedRpm;
  if (Object.keys(input.channelRoles).length > 0) sent.channelRoles = input.channelRoles;
  if (Object.keys(input.probeScales).length > 0) sent.probeScales = input.probeScales;
  if (input.channelOffsets && Object.keys(input.channelOffsets).length > 0) sent.channelOffsets = input.channelOffsets;
  const out: Record<string, [unknown, unknown]> = {};
  for (const [key, value] of Object.entries(sent)) {
    const stored = capture[key as keyof Capture];
    if (JSON.stringify(stored) !== JSON.stringify(value)) out[key] = [stored, value];
  }
  return Object.keys(out).length > 0 ? out : null;
}

export async function registerCapture(actor: Actor, input: Registration): Promise<{ capture: CaptureStatusView; duplicate: boolean; upload: UploadPlan | null; settingsDiffer?: Record<string, [unknown, unknown]> | null }> {
  const scope = requireUploader(actor);
  const limit = getEnv().UPLOAD_MAX_BYTES;
  if (input.sizeBytes > limit) throw new HttpError(413, `The file is ${mib(input.sizeBytes)}: the limit is ${mib(limit)}`);
  const stationId = actor.stationId ?? input.stationId ?? null;
  if (input.stationId && !actor.stationId && !(await getStation(scope, input.stationId))) throw new HttpError(422, "Unknown bench for this lab");
  // Unknown instruments are refused (400, field "instruments") before anything is stored, a new unit included.
  const instruments = await resolveRegistrationInstruments(scope.labId, input.instruments);
  const unit = await resolveUnit(scope, input);
  const id = randomUUID();
  const { capture, duplicate } = await insertCaptureOnce({
    id, unitId: unit.id, labId: scope.labId, stationId, uploadedById: actor.userId, stationKeyId: actor.stationKeyId,
    testKind: input.testKind, speedRpm: input.speedRpm ?? null, channelRoles: input.channelRoles, probeScales: input.probeScales,
    channelOffsets: input.channelOffsets, sampleRateHz: input.sampleRateHz ?? null,
    notes: input.notes, originalName: input.fileName, objectKey: captureObjectKey(scope.labId, unit.id, id),
    sizeBytes: input.sizeBytes, sha256: input.sha256,
  });
  if (duplicate) {
    let upload: UploadPlan | null = null;
    if (capture.state === "uploading") upload = await takeOverUpload(scope, capture, input.sizeBytes);
    else if (capture.sizeBytes !== input.sizeBytes) throw new HttpError(409, "A capture with this sha256 but another size exists for this unit");
    const view = await getCaptureStatusView(actor, capture.id);
    if (!view) throw new Error("a capture just stored could not be read back");
    // The same file with other settings: say so, so the sender can apply them as a correction (PATCH).
    return { capture: view, duplicate, upload, settingsDiffer: upload ? null : differingSettings(capture, input) };
  }
  // A row just inserted whose answer does not reach the client (the store or the database failed
  // half-way) goes again, so the client's retry is a fresh registration, not an "upload in progress".
  try {
    await recordRegistrationInstruments(capture.id, stationId, instruments);
    const upload = await planUpload(scope, capture);
    const view = await getCaptureStatusView(actor, capture.id);
    if (!view) throw new Error("a capture just stored could not be read back");
    // The same file with other settings: say so, so the sender can apply them as a correction (PATCH).
    return { capture: view, duplicate, upload, settingsDiffer: upload ? null : differingSettings(capture, input) };
  } catch (err) {
    await deleteUploadingCapture(scope, capture.id).catch((e: unknown) => console.error(`could not remove half-registered capture ${capture.id}: ${String(e)}`));
    throw err;
  }
}

/** The same file registered again while its capture is still uploading. */
async function takeOverUpload(scope: Actor["scope"], capture: Capture, sizeBytes: number): Promise<UploadPlan> {
  const taken = await takeOverIdleUpload(scope, capture.id, UPLOAD_LEASE_S * 1000, sizeBytes);
  if (taken.kind === "busy") {
    throw new HttpError(409, `An upload of this file for this unit is in progress: wait for it to finish (try again in ${taken.retryAfterS} s)`, taken.retryAfterS);
  }
  if (taken.kind === "gone") throw new HttpError(409, "This capture changed while it was registered again: send the file again");
  // The earlier client's parts go (where the store can abort); its completion now fails and it registers again.
  if (capture.multipartUploadId) await abortMultipartUpload(capture.objectKey, capture.multipartUploadId).catch(() => false);
  return planUpload(scope, taken.capture);
}

/** Part URLs, each bound to its part's length and the sha256 the client computed for it. */
export async function presignCaptureParts(actor: Actor, captureId: string, parts: { partNumber: number; sha256: string }[]): Promise<PartUrl[]> {
  const scope = requireUploader(actor);
  const found = await getCaptureDetail(scope, captureId);
  if (!found) throw new HttpError(404, "No such capture");
  const { capture } = found;
  if (capture.state !== "uploading" || !capture.multipartUploadId) throw new HttpError(409, "This capture is not awaiting a multipart upload");
  const count = partCountFor(capture.sizeBytes);
  if (parts.some((p) => p.partNumber > count)) throw new HttpError(400, `This upload has ${count} parts`);
  await touchUploadingCapture(scope, capture.id);
  const partSize = partSizeFor(capture.sizeBytes);
  return presignParts(capture.objectKey, capture.multipartUploadId, parts.map((p) => ({
    partNumber: p.partNumber, sizeBytes: Math.min(partSize, capture.sizeBytes - (p.partNumber - 1) * partSize), sha256Base64: sha256Base64(p.sha256),
  })));
}

/**
 * Refuses the upload and keeps nothing that could pass for a capture: neither the object nor the
 * row, so the same file can be registered and sent again at once.
 */
async function refuse(scope: Actor["scope"], capture: Capture, status: number, message: string): Promise<never> {
  await deleteIncompleteObject(capture.objectKey).catch(() => undefined);
  await deleteUploadingCapture(scope, capture.id);
  throw new HttpError(status, `${message}. Nothing was kept: register the file again to resend it`);
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
        await completeMultipartUpload(capture.objectKey, capture.multipartUploadId, input.parts.map((p) => ({ ...p, sha256: p.sha256 ? sha256Base64(p.sha256) : undefined })));
      } catch (err) {
        if (isConnectionFailure(err)) throw err;
        // The store's code names the problem (InvalidPart, NoSuchUpload...); its message may name hosts.
        const code = (err as { name?: string } | null)?.name ?? "refused";
        throw new HttpError(400, `The object store refused to assemble the parts (${code}): check each part's ETag, or register the file again`);
      }
    }
    const stored = await headObject(capture.objectKey);
    if (!stored) throw new HttpError(409, "Nothing has been uploaded for this capture yet");
    if (stored.sizeBytes !== capture.sizeBytes) {
      await refuse(scope, capture, 400, `The uploaded file has ${stored.sizeBytes} bytes, but ${capture.sizeBytes} were registered`);
    }
    const head = await readObjectHead(capture.objectKey, Math.min(HEADER_PROBE_BYTES, capture.sizeBytes));
    let sniffed: SniffedHeader | null = null;
    try {
      // The byte-order mark picks UTF-8 or UTF-16; binary data and UTF-16 without one are refused.
      sniffed = sniffCaptureBytes(head);
    } catch (err) {
      if (!(err instanceof CaptureRejection)) throw err;
      await refuse(scope, capture, err.code === "binary" ? 415 : 422, err.message.replace(/[.\s]+$/, ""));
    }
    if (sniffed) await rememberOrApplyProfile(actor, capture, sniffed);
    const queued = await markCaptureQueued(scope, capture.id, stored.etag);
    // Read before enqueueing, so the answer says what completion did (queued), not how far a fast worker got.
    const view = await getCaptureStatusView(actor, capture.id);
    // The row says queued either way; if Redis is unreachable now, the worker's sweep enqueues it later.
    if (queued) await enqueueAnalysisOrLater({ captureId: capture.id, labId: capture.labId });
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
