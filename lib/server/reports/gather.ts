import "server-only";
import { getProfileInForce, listActivePlanSteps } from "@/db/queries/judgement";
import { loadCaptureInstruments, loadRecordCaptures, loadReportRemarks, loadReportUnit } from "@/db/queries/report-inputs";
import { evaluateUnitPlan } from "@/db/queries/unit-plan";
import { analysisReportSchema, ratingSchema, toleranceProfileSchema, type PlanEvaluation } from "@/lib/analysis";
import { TEST_KIND_LABELS } from "@/lib/captures/input-schemas";
import type { ContentInput, RecordCapture } from "@/lib/reports/build-content";
import { parsePlotData, type PlotData } from "@/lib/reports/pdf/plots";

// Everything a report of a unit is drawn from, read for a lab that the caller has already checked
// holds the unit: the plan's captures of record with their analyses, plots, instruments and remarks.

export type Gathered = {
  base: Omit<ContentInput, "number" | "revision" | "issuedAt" | "authorisedBy" | "supersedes">;
  plots: Map<string, PlotData>;
  footer: string;
  clientId: string;
  planState: string;
  /** Names of plan steps without a capture of record. */
  missingSteps: string[];
};

export async function gatherReportInputs(labId: string, unitId: string): Promise<Gathered | null> {
  const found = await loadReportUnit(labId, unitId);
  if (!found) return null;
  const scope = { kind: "lab" as const, labId };
  const [plan, steps, profileRow] = await Promise.all([evaluateUnitPlan(scope, unitId), listActivePlanSteps(found.rating.id), getProfileInForce(found.rating.id)]);
  if (!plan) return null;
  const recordIds = plan.steps.flatMap((s) => (s.record ? [s.record.captureId] : []));
  const [rows, instruments, remarks] = await Promise.all([
    loadRecordCaptures(labId, unitId, recordIds), loadCaptureInstruments(recordIds), loadReportRemarks(unitId, recordIds),
  ]);
  const records: RecordCapture[] = [];
  const plotsByCapture = new Map<string, PlotData>();
  for (const r of rows) {
    const report = analysisReportSchema.safeParse(r.report);
    if (!report.success) continue;
    records.push({ ...r, report: report.data });
    plotsByCapture.set(r.id, parsePlotData(r.preview, r.spectrum));
  }
  const plots = new Map<string, PlotData>();
  for (const s of plan.steps) {
    const p = s.record ? plotsByCapture.get(s.record.captureId) : undefined;
    if (p) plots.set(s.stepId, p);
  }
  const nameplate = ratingSchema.safeParse(found.rating.nameplate);
  const profile = profileRow ? toleranceProfileSchema.safeParse(profileRow.profile) : null;
  const byStep = new Map(plan.steps.map((s) => [s.stepId, s]));
  const missingSteps = steps.filter((s) => !byStep.get(s.id)?.record || !records.some((r) => r.id === byStep.get(s.id)?.record?.captureId)).map((s) => s.name);
  return {
    base: {
      lab: { name: found.lab.name, address: found.lab.address },
      client: { name: found.client.name, address: found.client.address },
      unit: { serial: found.unit.serial, disposition: found.unit.disposition },
      rating: { modelCode: found.rating.modelCode, title: found.rating.title, nameplate: nameplate.success ? nameplate.data : null },
      profile: profile?.success ? profile.data : null,
      plan,
      steps: steps.map((s) => ({ id: s.id, name: s.name, testKind: s.testKind })),
      testKindLabels: TEST_KIND_LABELS,
      records,
      instruments,
      remarks,
    },
    plots,
    footer: found.footer,
    clientId: found.unit.organisationId,
    planState: plan.state,
    missingSteps: steps.length === 0 ? ["(the rating has no test plan)"] : missingSteps,
  };
}

/** The names of the plan's steps without a capture of record (the unit page's release panel). */
export function missingStepNames(plan: PlanEvaluation, steps: readonly { id: string; name: string }[]): string[] {
  if (steps.length === 0) return ["(the rating has no test plan)"];
  const recorded = new Set(plan.steps.filter((s) => s.record).map((s) => s.stepId));
  return steps.filter((s) => !recorded.has(s.id)).map((s) => s.name);
}
