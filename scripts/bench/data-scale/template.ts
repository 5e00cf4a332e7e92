// The analysis the data-scale seed copies onto every capture: the engine's own result for a demo
// capture (scripts/demo), stored the way the worker stores it (report, preview, spectrum, figure rows).
import { analyseCapture, computeWaveformEnvelope, parseCaptureText, profileFromPreset, type ChannelRole } from "@/lib/analysis";
import { demoInstruments, demoRatings } from "@/db/seed-data";
import { figureRowsOf, type FigureRow } from "@/lib/trends/figure-rows";
import { PREVIEW_BUCKETS, spectrumOf, worstThd } from "@/worker/processors/run-analysis";
import { demoCaptures } from "../../demo/scenario";
import { renderDemoCsv } from "../../demo/waveforms";

export type TemplateAnalysis = {
  report: unknown; preview: unknown; spectrum: unknown; figures: FigureRow[];
  overall: string | null; frequencyHz: number | null; worstThdPercent: number | null; analysisVersion: string;
};

const round = (v: number) => (Number.isFinite(v) ? Number(v.toPrecision(6)) : 0);

/** Analyses the first KG-45T demo capture (open circuit, 400 V 50 Hz) with the bay-1 instruments. */
export function templateAnalysis(): TemplateAnalysis {
  const capture = demoCaptures[0];
  const rating = demoRatings.find((r) => r.modelCode === "KG-45T");
  if (!capture || !rating) throw new Error("data-scale: the demo scenario has no KG-45T capture");
  const step = rating.plan[0];
  const profile = profileFromPreset(rating.preset, rating.nameplate);
  const parsed = parseCaptureText(renderDemoCsv({ ...capture.wave, seed: 1000 }));
  const instruments = demoInstruments.filter((d) => (d.benches as readonly number[]).includes(0)).map((d) => ({ assetTag: d.assetTag, kind: d.kind, channel: "", spec: { ...d.spec } }));
  const report = analyseCapture(parsed, {
    channelRoles: capture.roles as Record<string, ChannelRole>, speedRpm: capture.speedRpm, poles: rating.nameplate.poles,
    harmonics: profile.harmonicOrder, rating: rating.nameplate, profile, checks: step?.checks, stepName: step?.name, instruments,
  });
  const envelope = computeWaveformEnvelope(parsed, PREVIEW_BUCKETS);
  const preview = { timeS: envelope.timeS.map(round), channels: envelope.channels.map((c) => ({ id: c.id, min: c.min.map(round), max: c.max.map(round) })) };
  return {
    report, preview, spectrum: spectrumOf(report), figures: figureRowsOf(report),
    overall: report.overall, frequencyHz: report.frequencyHz, worstThdPercent: worstThd(report), analysisVersion: report.analysisVersion,
  };
}
