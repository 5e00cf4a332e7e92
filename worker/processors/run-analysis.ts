import {
  analyseCapture, CaptureRejection, computeWaveformEnvelope, ratingSchema, toleranceProfileSchema,
  type AnalysisReport, type ChannelRole, type UncertaintyInstrument,
} from "@/lib/analysis";
import type { NewAnalysis } from "@/db/queries/analyses";
import type { Capture } from "@/db/schema";
import { getEnv } from "@/lib/server/env";
import { ConfigurationProblem, toleranceDigest, type Judgement } from "@/lib/server/judgement";
import { talkingTo } from "@/lib/server/outage";
import { isPreconditionFailed } from "@/lib/server/storage";
import { readStoredCapture, type StoredRead } from "@/lib/server/stored-capture";

/** Points per channel in the stored waveform preview: enough for a full-width plot, small as JSON. */
export const PREVIEW_BUCKETS = 2000;

const round = (v: number) => (Number.isFinite(v) ? Number(v.toPrecision(6)) : 0);

export function spectrumOf(report: AnalysisReport) {
  return {
    frequencyHz: report.frequencyHz,
    channels: report.channels.map((c) => ({
      id: c.id, role: c.role, unit: c.unit,
      orders: [1, ...c.harmonics.map((h) => h.order)],
      rms: [round(c.fundamental.rms), ...c.harmonics.map((h) => round(h.rms))],
    })),
  };
}

export function worstThd(report: AnalysisReport): number | null {
  const values = report.channels.filter((c) => c.unit === "V").map((c) => c.thdFPercent).filter((v): v is number => v !== null);
  return values.length > 0 ? Math.max(...values) : null;
}

/**
 * Reads the raw object (large ones with parallel ranged GETs into the two-thread ingestion), checks
 * it against the sha256 and size recorded at upload, then analyses the parse.
 * Progress runs 0–80 while reading (the parse happens as bytes arrive), then 90 once analysed.
 * Throws CaptureRejection for input the engine or the integrity check refuses.
 */
export async function runAnalysis(
  capture: Capture, judgement: Judgement, onProgress: (percent: number) => void, instruments: readonly UncertaintyInstrument[] = [],
): Promise<NewAnalysis> {
  const { rating, step } = judgement;
  const nameplate = ratingSchema.safeParse(rating.nameplate);
  const tolerance = toleranceProfileSchema.safeParse(judgement.profile.profile);
  if (!nameplate.success || !tolerance.success) {
    throw new ConfigurationProblem(`The rating ${rating.modelCode} or its tolerance profile is incomplete or invalid: fix it, then re-run the analysis`);
  }
  const ids = new Set([...Object.keys(capture.probeScales), ...Object.keys(capture.channelOffsets)]);
  const calibration = Object.fromEntries([...ids].map((id) => [id, { scale: capture.probeScales[id], offset: capture.channelOffsets[id] }]));
  const parseOptions = {
    calibration, maxBytes: getEnv().UPLOAD_MAX_BYTES, expectedBytes: capture.sizeBytes,
    ...(capture.sampleRateHz !== null ? { sampleRateHz: capture.sampleRateHz } : {}),
  };
  let stored: StoredRead;
  try {
    // A store that stops answering mid-read is an outage (retried from the start), not a bad file.
    stored = await talkingTo("file store", () => readStoredCapture(capture, parseOptions, (share) => onProgress(80 * share)));
  } catch (err) {
    if (isPreconditionFailed(err)) {
      throw new CaptureRejection("object-changed", "The stored file changed after its upload was completed: upload it again as a new capture");
    }
    throw err;
  }
  if (stored.bytes !== capture.sizeBytes || stored.sha256 !== capture.sha256) {
    throw new CaptureRejection(
      "checksum-mismatch",
      `The stored file (${stored.bytes} bytes) does not match the sha256 and size given at upload: upload the file again`,
    );
  }
  if (!stored.parsed) throw stored.parseError;
  const parsed = stored.parsed;
  if (capture.speedRpm !== null && !(capture.speedRpm >= 1)) {
    // Speeds stored before the 1 rpm bound: refused with the field named rather than a schema error.
    throw new CaptureRejection("speed-too-low", `The shaft speed given, ${capture.speedRpm} rpm, is below 1 rpm: correct the capture's speed`);
  }
  const magnet = nameplate.data.magnetMaterial && capture.magnetTemperatureC !== null
    ? { measuredC: capture.magnetTemperatureC, referenceC: nameplate.data.magnetReferenceC ?? 20, material: nameplate.data.magnetMaterial }
    : undefined;
  const report = analyseCapture(parsed, {
    channelRoles: capture.channelRoles as Record<string, ChannelRole>,
    speedRpm: capture.speedRpm ?? undefined,
    poles: nameplate.data.poles,
    harmonics: tolerance.data.harmonicOrder,
    rating: nameplate.data,
    profile: tolerance.data,
    checks: step?.checks,
    stepName: step?.name,
    magnetTemperature: magnet,
    instruments: [...instruments],
  });
  onProgress(90);
  const envelope = computeWaveformEnvelope(parsed, PREVIEW_BUCKETS);
  const preview = {
    timeS: envelope.timeS.map(round),
    channels: envelope.channels.map((c) => ({ id: c.id, min: c.min.map(round), max: c.max.map(round) })),
  };
  return {
    captureId: capture.id,
    analysisVersion: report.analysisVersion,
    toleranceDigest: toleranceDigest(rating, judgement.profile, step),
    profileVersionId: judgement.profile.id,
    planStepId: step?.id ?? null,
    kind: "analysis",
    report,
    overall: report.overall,
    frequencyHz: report.frequencyHz,
    worstThdPercent: worstThd(report),
    vufPercent: report.threePhase?.unbalance.vufPercent ?? null,
    keLineRmsPerKrpm: report.backEmf?.keLineRmsPerKrpm ?? null,
    preview,
    spectrum: spectrumOf(report),
  };
}
