import "server-only";
import { getCaptureDetail } from "@/db/queries/captures";
import {
  copyStationInstrumentsOnce, insertOverdueConfirmation, listCaptureInstruments, overdueCapturesOfUnit, replaceCaptureInstruments,
  unitInScope, type InstrumentOnCapture,
} from "@/db/queries/instruments";
import { HttpError } from "@/lib/auth/guards";
import { overdueConfirmationSchema } from "@/lib/instruments/input-schemas";
import { utcDay, wasOverdueOn } from "@/lib/instruments/status";
import { requirePageActor, type Actor } from "./actor";
import { instrumentChoices, resolveInstrumentRefs } from "./instruments";
import { parseFields } from "./setup-access";
import { signWithPassword } from "./signatures";

// The instruments a capture was taken with: defaulted from its bench, editable, warned on when one
// was past its calibration due date on the upload day, and confirmed by a quality engineer.

export type CaptureInstrumentView = {
  id: string; assetTag: string; kind: string; description: string; serial: string; channel: string;
  calibrationDue: string | null; overdueAtUpload: boolean; retired: boolean;
};

export type CaptureInstrumentsSummary = {
  instruments: CaptureInstrumentView[];
  /** One sentence per overdue instrument; empty when none. */
  warnings: string[];
  confirmation: { reason: string; confirmedAt: string } | null;
};

const uploadDayOf = (c: { uploadedAt: Date | null; createdAt: Date }) => utcDay(c.uploadedAt ?? c.createdAt);

function viewOf(rows: InstrumentOnCapture[], uploadedOn: string): CaptureInstrumentView[] {
  return rows.map(({ instrument: i, channel }) => ({
    id: i.id, assetTag: i.assetTag, kind: i.kind, description: `${i.make} ${i.model}`, serial: i.serial, channel,
    calibrationDue: i.calibrationDue, overdueAtUpload: wasOverdueOn(i.calibrationDue, uploadedOn), retired: i.retiredAt !== null,
  }));
}

/** The capture's instruments and overdue warnings for the page and the API; null for a capture out of scope. */
export async function getCaptureInstruments(actor: Actor, captureId: string): Promise<CaptureInstrumentsSummary | null> {
  const found = await getCaptureDetail(actor.scope, captureId);
  if (!found) return null;
  const uploadedOn = uploadDayOf(found.capture);
  const instruments = viewOf(await listCaptureInstruments(captureId), uploadedOn);
  const warnings = instruments.filter((i) => i.overdueAtUpload).map((i) =>
    `Instrument ${i.assetTag} (${i.description}) was past its calibration due date (${i.calibrationDue}) when this capture was uploaded on ${uploadedOn}: a quality engineer must confirm the capture before a report is released.`);
  const confirmed = warnings.length > 0 && actor.scope.kind === "lab" ? (await overdueCapturesOfUnit(actor.scope, found.capture.unitId)).find((o) => o.captureId === captureId)?.confirmation ?? null : null;
  return { instruments, warnings, confirmation: confirmed ? { reason: confirmed.reason, confirmedAt: confirmed.createdAt.toISOString() } : null };
}

/** Lab managers, operators and quality engineers may say which instruments took a capture. */
export async function setCaptureInstruments(actor: Actor, captureId: string, raw: unknown): Promise<CaptureInstrumentsSummary> {
  if (actor.scope.kind !== "lab" || !["admin", "operator", "qa", "station"].includes(actor.role)) throw new HttpError(403, "Only lab staff record a capture's instruments");
  const found = await getCaptureDetail(actor.scope, captureId);
  if (!found) throw new HttpError(404, "No such capture");
  await replaceCaptureInstruments(captureId, await resolveInstrumentRefs(actor.scope.labId, raw, "instruments"));
  return (await getCaptureInstruments(actor, captureId)) as CaptureInstrumentsSummary;
}

/**
 * At registration: the instruments the sender named (validated, field "instruments"), else the bench's
 * default set. Resolve before inserting the capture so an unknown instrument leaves nothing behind.
 */
export async function resolveRegistrationInstruments(labId: string, raw: unknown): Promise<{ instrumentId: string; channel: string }[] | null> {
  if (raw === undefined || raw === null) return null;
  return resolveInstrumentRefs(labId, raw, "instruments");
}

export async function recordRegistrationInstruments(captureId: string, stationId: string | null, named: { instrumentId: string; channel: string }[] | null): Promise<void> {
  if (named) await replaceCaptureInstruments(captureId, named);
  else if (stationId) await copyStationInstrumentsOnce(stationId, captureId);
}

/**
 * A quality engineer confirms, with a reason and a password signature ("overdue-instrument"), that a
 * capture taken with an overdue instrument may be reported. Refused when nothing was overdue.
 */
export async function confirmOverdueCapture(actor: Actor, raw: unknown, address: string): Promise<void> {
  if (actor.scope.kind !== "lab" || actor.role !== "qa" || !actor.userId) throw new HttpError(403, "Only a quality engineer confirms a capture taken with an overdue instrument");
  const input = parseFields(overdueConfirmationSchema, raw, 400);
  const found = await getCaptureDetail(actor.scope, input.captureId);
  if (!found) throw new HttpError(404, "No such capture");
  const overdue = (await overdueCapturesOfUnit(actor.scope, found.capture.unitId)).find((o) => o.captureId === input.captureId);
  if (!overdue) throw new HttpError(409, "No instrument of this capture was past its due date: there is nothing to confirm");
  if (overdue.confirmation) throw new HttpError(409, "This capture is already confirmed");
  const signature = await signWithPassword(actor, { password: input.password, purpose: "overdue-instrument", subjectKind: "capture", subjectId: input.captureId, address });
  await insertOverdueConfirmation({ captureId: input.captureId, reason: input.reason, confirmedById: actor.userId, signatureId: signature.id });
}

/**
 * Why a unit's report may not be released yet as far as instruments go: one sentence per capture taken
 * with an overdue instrument and not confirmed. Empty when nothing blocks. The release code refuses on any.
 */
export async function releaseBlockersFromInstruments(actor: Actor, unitId: string): Promise<string[]> {
  if (actor.scope.kind !== "lab") throw new HttpError(403, "Only the lab releases reports");
  if (!/^[0-9a-f-]{36}$/i.test(unitId) || !(await unitInScope(actor.scope, unitId))) throw new HttpError(404, "No such unit");
  return (await overdueCapturesOfUnit(actor.scope, unitId))
    .filter((o) => !o.confirmation)
    .map((o) => `Capture ${o.originalName} (uploaded ${o.uploadedOn}) was taken with ${o.instruments.map((i) => `${i.assetTag}, due ${i.calibrationDue}`).join("; ")}: a quality engineer must confirm it before release.`);
}

/** For the capture page: the summary, the choices for lab staff, and whether the viewer may confirm. */
export async function getCaptureInstrumentsPageView(captureId: string) {
  const actor = await requirePageActor();
  const summary = /^[0-9a-f-]{36}$/i.test(captureId) ? await getCaptureInstruments(actor, captureId) : null;
  if (!summary) return null;
  const labStaff = actor.scope.kind === "lab" && actor.role !== "station";
  return { summary, choices: labStaff ? await instrumentChoices(actor) : null, canConfirm: actor.role === "qa" && summary.warnings.length > 0 && !summary.confirmation };
}
