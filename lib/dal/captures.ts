import "server-only";
import { getCurrentAnalysis, listAnalysisHistory } from "@/db/queries/analyses";
import { getCaptureDetail } from "@/db/queries/captures";
import { getUnitBySerial, listRatingsForRegistration } from "@/db/queries/units";
import type { AnalysisReport } from "@/lib/analysis";
import { HttpError } from "@/lib/auth/guards";
import { requireUser } from "@/lib/auth/guards";
import { getEnv } from "@/lib/server/env";
import { presignVerifiedDownload } from "@/lib/server/storage";
import { listActivePlanSteps } from "@/db/queries/judgement";
import { requirePageActor, type Actor } from "./actor";
import { unitCapturesInScope } from "./request-reads";
import { getCaptureCorrections } from "./capture-corrections";
import { getCaptureInstruments, type CaptureInstrumentsSummary } from "./capture-instruments";

// One read path for the capture page, the browser's polling handlers and the bench API.

export type CaptureStatusView = {
  id: string; unitId: string; serial: string; ratingId: string; modelCode: string; ratingTitle: string;
  state: "uploading" | "queued" | "analysing" | "analysed" | "rejected" | "failed";
  stateMessage: string | null; progress: number; attempts: number;
  testKind: string; speedRpm: number | null; channelRoles: Record<string, string>; probeScales: Record<string, number>;
  channelOffsets: Record<string, number>; magnetTemperatureC: number | null; planStepId: string | null;
  notes: string; originalName: string; sizeBytes: number; sha256: string; stationName: string | null; uploadedBy: string | null;
  createdAt: string; uploadedAt: string | null; analysedAt: string | null;
  /** The instruments that took it, and a warning per instrument past its due date on the upload day. */
  instruments: CaptureInstrumentsSummary;
  analysis: null | {
    analysisVersion: string; overall: string | null; frequencyHz: number | null; worstThdPercent: number | null;
    vufPercent: number | null; keLineRmsPerKrpm: number | null; createdAt: string; report: AnalysisReport;
    /** The tolerance profile version and plan step the verdicts were judged against. */
    profileVersion: number | null; stepName: string | null; kind: "analysis" | "rejudge";
  };
};

export const FINAL_STATES = new Set(["analysed", "rejected", "failed"]);

/** Shown while a capture's analysis has not moved for longer than a worker's lock. */
export const WORKER_SILENT_MESSAGE = "The worker stopped responding; the analysis will be resumed.";

/**
 * What to tell people about the capture's state: an analysing capture whose row has not moved for
 * longer than the lock has lost its worker (a live one writes progress or why it waits far more
 * often); the sweep or the stalled check will give it to another.
 */
export function captureStateMessage(c: { state: string; stateMessage: string | null; updatedAt: Date }, lockMs: number, now = Date.now()): string | null {
  if (c.state === "analysing" && now - c.updatedAt.getTime() > lockMs) return WORKER_SILENT_MESSAGE;
  return c.stateMessage;
}

export async function getCaptureStatusView(actor: Actor, captureId: string): Promise<CaptureStatusView | null> {
  const found = await getCaptureDetail(actor.scope, captureId);
  if (!found) return null;
  const c = found.capture;
  // A capture queued again for re-analysis keeps showing its current result until the new one lands.
  const [analysis, instruments] = await Promise.all([
    c.state === "uploading" ? undefined : getCurrentAnalysis(actor.scope, captureId),
    getCaptureInstruments(actor, captureId),
  ]);
  return {
    id: c.id, unitId: c.unitId, serial: found.serial, ratingId: found.ratingId, modelCode: found.modelCode, ratingTitle: found.ratingTitle,
    state: c.state, stateMessage: captureStateMessage(c, getEnv().WORKER_LOCK_MS), progress: c.progress, attempts: c.attempts,
    testKind: c.testKind, speedRpm: c.speedRpm,
    channelRoles: c.channelRoles, probeScales: c.probeScales, channelOffsets: c.channelOffsets, magnetTemperatureC: c.magnetTemperatureC, planStepId: c.planStepId,
    // The operator's notes and staff names stay inside the lab.
    notes: actor.scope.kind === "lab" ? c.notes : "", originalName: c.originalName, sizeBytes: c.sizeBytes, sha256: c.sha256,
    stationName: found.stationName, uploadedBy: actor.scope.kind === "lab" ? found.uploadedBy : null,
    createdAt: c.createdAt.toISOString(), uploadedAt: c.uploadedAt?.toISOString() ?? null, analysedAt: c.analysedAt?.toISOString() ?? null,
    instruments: instruments ?? { instruments: [], warnings: [], confirmation: null },
    analysis: analysis
      ? {
          analysisVersion: analysis.analysisVersion, overall: analysis.overall, frequencyHz: analysis.frequencyHz,
          worstThdPercent: analysis.worstThdPercent, vufPercent: analysis.vufPercent, keLineRmsPerKrpm: analysis.keLineRmsPerKrpm,
          createdAt: analysis.createdAt.toISOString(), report: analysis.report as AnalysisReport,
          profileVersion: analysis.profileVersion, stepName: analysis.stepName, kind: analysis.kind,
        }
      : null,
  };
}

export type WaveformPreview = { timeS: number[]; channels: { id: string; min: number[]; max: number[] }[] };
export type SpectrumView = { frequencyHz: number; channels: { id: string; role: string; unit: string; orders: number[]; rms: number[] }[] };

/** The plot data of the current analysis, or null until there is one. */
export async function getCapturePlotView(actor: Actor, captureId: string): Promise<{ preview: WaveformPreview; spectrum: SpectrumView } | null> {
  const analysis = await getCurrentAnalysis(actor.scope, captureId);
  if (!analysis?.preview || !analysis.spectrum) return null;
  return { preview: analysis.preview as WaveformPreview, spectrum: analysis.spectrum as SpectrumView };
}

async function getCaptureHistory(actor: Actor, captureId: string) {
  return listAnalysisHistory(actor.scope, captureId);
}

/** A short-lived signed link to the raw file, for people (and keys) who may read the capture; only the object verified at upload is served. */
export async function getCaptureDownloadUrl(actor: Actor, captureId: string): Promise<string> {
  const found = await getCaptureDetail(actor.scope, captureId);
  if (!found) throw new HttpError(404, "No such capture");
  if (found.capture.state === "uploading") throw new HttpError(409, "The upload of this capture has not been completed");
  const url = await presignVerifiedDownload(found.capture.objectKey, found.capture.originalName, found.capture.objectEtag);
  if (url) return url;
  console.error(`capture ${captureId}: the stored object is missing or differs from the one verified at upload (ETag ${found.capture.objectEtag ?? "none"}); not served`);
  throw new HttpError(409, "The stored file is not the one verified at upload (it is missing or was replaced), so it is not served: ask the lab administrator");
}

/** A unit with its captures, their states and verdicts (bench API and unit page). */
export async function getUnitCapturesBySerial(actor: Actor, serial: string) {
  const found = await getUnitBySerial(actor.scope, serial);
  if (!found) return null;
  const rows = await unitCapturesInScope(actor.scope, found.unit.id);
  return {
    id: found.unit.id, serial: found.unit.serial, owner: found.owner, disposition: found.unit.disposition,
    latestOverall: found.unit.latestOverall, latestCaptureAt: found.unit.latestCaptureAt?.toISOString() ?? null,
    rating: { modelCode: found.rating.modelCode, title: found.rating.title },
    captures: rows.map((r) => ({ ...r, createdAt: r.createdAt.toISOString() })),
  };
}

/** The capture page: the status view plus the run history; null for missing and for other organisations' captures. */
export async function getCapturePageView(captureId: string) {
  const actor = await requirePageActor();
  if (!/^[0-9a-f-]{36}$/i.test(captureId)) return null;
  const capture = await getCaptureStatusView(actor, captureId);
  if (!capture) return null;
  const canReanalyse = actor.scope.kind === "lab" && (actor.role === "admin" || actor.role === "qa");
  const canCorrect = actor.scope.kind === "lab" && (actor.role === "admin" || actor.role === "qa" || actor.role === "operator");
  const [history, corrections, steps] = await Promise.all([
    getCaptureHistory(actor, captureId),
    canCorrect ? getCaptureCorrections(actor, captureId) : Promise.resolve([]),
    canCorrect ? listActivePlanSteps(capture.ratingId) : Promise.resolve([]),
  ]);
  return { capture, history, canReanalyse, canCorrect, corrections, planSteps: steps.map((s) => ({ id: s.id, name: s.name })) };
}

/** The unit page's captures list; the unit itself was already checked by the caller's scope. */
export async function getUnitCaptureRows(unitId: string) {
  const actor = await requirePageActor();
  const rows = await unitCapturesInScope(actor.scope, unitId);
  return rows.map((r) => ({ ...r, createdAt: r.createdAt.toISOString() }));
}

/** Ratings a lab manager may re-run analyses for (the re-analysis form). */
export async function getReanalysisRatings() {
  const actor = await requirePageActor();
  if (actor.role !== "admin") return [];
  const rows = await listRatingsForRegistration(actor.scope);
  return rows.map((r) => ({ id: r.id, label: `${r.modelCode} · ${r.title} (${r.owner})` }));
}
