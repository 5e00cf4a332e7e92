import type { AnalysisReport, PlanEvaluation, Rating, ToleranceProfile, VerdictStatus } from "@/lib/analysis";
import { DISPOSITION_WORDS } from "@/lib/units/disposition-rules";
import { decisionRuleStatement, expandedUncertaintyOf } from "./uncertainty-content";
import { describeNameplate } from "@/lib/ratings/describe";
import { VERDICT_WORDS } from "@/lib/verdicts/words";
import { reportContentSchema, type ReportCheck, type ReportContent, type ReportStep } from "./content";

// Turns what the release gathered (unit, plan evaluation, captures of record, instruments, remarks) into
// the stored content of a report. Pure: the same input gives the same content, and the PDF draws only this.

export type RecordCapture = {
  id: string; originalName: string; sha256: string; createdAt: Date; speedRpm: number | null; magnetTemperatureC: number | null;
  analysisVersion: string; overall: VerdictStatus | null; report: AnalysisReport;
};

export type ContentInput = {
  number: string;
  revision: number;
  issuedAt: Date;
  lab: { name: string; address: string };
  client: { name: string; address: string };
  unit: { serial: string; disposition: string };
  rating: { modelCode: string; title: string; nameplate: Rating | null };
  profile: ToleranceProfile | null;
  plan: PlanEvaluation;
  steps: readonly { id: string; name: string; testKind: string }[];
  testKindLabels: Record<string, string>;
  records: readonly RecordCapture[];
  instruments: readonly { captureId: string; channel: string; kind: string; make: string; model: string; serial: string; assetTag: string; calibrationDue: string | null }[];
  remarks: {
    choices: readonly { stepName: string; reason: string }[];
    overdue: readonly { captureId: string; reason: string }[];
    concession: { comment: string; reference: string | null } | null;
    clientNotes: readonly string[];
  };
  authorisedBy: { name: string; role: string; signedAt: Date; meaning: string };
  supersedes: { revision: number; reason: string } | null;
};

const fmt = (n: number | null | undefined, digits = 5) => (n === null || n === undefined || !Number.isFinite(n) ? "—" : String(Number(n.toPrecision(digits))));

/** "≤ 5 %", "380 – 420 V", "≥ 0.9"; "not required" when the check was not judged for the step. */
export function limitWords(lower: number | null, upper: number | null, unit: string, status: VerdictStatus, reason?: string | null): string {
  if (status === "not-required") return reason ? `not required: ${reason}` : "not required";
  const u = unit ? ` ${unit}` : "";
  if (lower !== null && upper !== null) return `${fmt(lower)} – ${fmt(upper)}${u}`;
  if (upper !== null) return `≤ ${fmt(upper)}${u}`;
  if (lower !== null) return `≥ ${fmt(lower)}${u}`;
  return "—";
}

function checksOf(report: AnalysisReport): ReportCheck[] {
  return report.verdicts.map((v) => ({
    checkId: v.check, label: v.label, order: null,
    value: typeof v.measured === "number" ? v.measured : null,
    unit: v.unit, limit: limitWords(v.lower ?? null, v.upper ?? null, v.unit, v.status, v.reason),
    lower: v.lower ?? null, upper: v.upper ?? null, verdict: v.status, expandedUncertainty: expandedUncertaintyOf(report, v.check), source: v.source,
  }));
}

/** Capture-quality notes in plain words: the engine's messages, never its codes. */
function notesOf(report: AnalysisReport): string[] {
  const notes = report.warnings.map((w) => w.message.trim()).filter((m) => m.length > 0);
  for (const v of report.verdicts) if (v.status === "inconclusive" && v.reason) notes.push(`${v.label} could not be judged: ${v.reason}`);
  return [...new Set(notes)];
}

function stepsOf(input: ContentInput): ReportStep[] {
  const byStep = new Map(input.plan.steps.map((s) => [s.stepId, s]));
  const records = new Map(input.records.map((r) => [r.id, r]));
  return input.steps.map((step) => {
    const evaluation = byStep.get(step.id);
    const record = evaluation?.record ? records.get(evaluation.record.captureId) ?? null : null;
    return {
      stepId: step.id, name: step.name, testKind: input.testKindLabels[step.testKind] ?? step.testKind,
      capture: record
        ? {
            id: record.id, fileName: record.originalName, sha256: record.sha256, capturedAt: record.createdAt.toISOString(),
            speedRpm: record.speedRpm, magnetTemperatureC: record.magnetTemperatureC, analysisVersion: record.analysisVersion, overall: record.overall,
          }
        : null,
      checks: record ? checksOf(record.report) : [],
      notes: record ? notesOf(record.report) : [],
    };
  });
}

function unitResultsOf(plan: PlanEvaluation): ReportContent["unitResults"] {
  const fit = plan.keFit;
  if (!fit) return [];
  const band = limitWords(fit.lower, fit.upper, fit.unit, fit.status);
  return [
    { label: "Ke across speeds (fit through the origin)", value: `${fmt(fit.ke)} ${fit.unit} from ${fit.points.length} speed(s); band ${band}; ${VERDICT_WORDS[fit.status]}` },
    { label: "Ke linearity (largest deviation from the fit)", value: `${fmt(fit.linearityPercent, 3)} %` },
    { label: "Ke limit source", value: fit.source },
  ];
}

function methodsOf(input: ContentInput, steps: ReportStep[]): string[] {
  const sources = new Set<string>();
  for (const s of steps) for (const c of s.checks) if (c.verdict !== "not-required" && c.source) sources.add(`${c.label}: ${c.source}`);
  const engines = new Set(input.records.map((r) => r.analysisVersion));
  const profile = input.profile ? [`Tolerance profile: ${input.profile.label}`] : [];
  return [...profile, ...sources, `Analysis engine version ${[...engines].join(", ") || "—"} (Emfolio)`];
}

function decisionRuleOf(profile: ToleranceProfile | null): string {
  const zone = profile?.marginalZonePercent ?? 10;
  const rule = decisionRuleStatement(profile?.decisionRule);
  const marginal = ` Under simple acceptance a result inside its band but within ${fmt(zone, 3)} % of the distance from nominal to the limit is "Near edge" (marginal).`;
  return `${rule}${marginal} Outside the band a result is "Outside". A figure that is missing, not finite or invalidated by a capture-quality warning is "Inconclusive", never a pass.`;
}

function deviationsOf(input: ContentInput, steps: ReportStep[]): string[] {
  const out: string[] = [];
  for (const s of steps) if (!s.capture) out.push(`Plan step "${s.name}" has no capture of record: it is reported as not tested.`);
  for (const c of input.remarks.choices) out.push(`For plan step "${c.stepName}" a quality engineer chose the capture of record instead of the latest: ${c.reason}`);
  const names = new Map(input.records.map((r) => [r.id, r.originalName]));
  for (const o of input.remarks.overdue) out.push(`${names.get(o.captureId) ?? "A capture"} was taken with an instrument past its calibration due date; reported after confirmation: ${o.reason}`);
  if (input.unit.disposition === "accepted-with-concession") {
    const c = input.remarks.concession;
    out.push(`The unit was accepted under the client's concession${c?.reference ? ` (reference ${c.reference})` : ""}${c?.comment ? `: ${c.comment}` : "."}`);
  }
  return out;
}

export function buildReportContent(input: ContentInput): ReportContent {
  const steps = stepsOf(input);
  const uncertain = steps.some((s) => s.checks.some((c) => c.expandedUncertainty !== null));
  const kinds = new Map(input.instruments.map((i) => [`${i.kind}|${i.serial}`, i]));
  const content: ReportContent = {
    version: 1,
    number: input.number,
    revision: input.revision,
    issuedAt: input.issuedAt.toISOString(),
    lab: input.lab,
    client: input.client,
    unit: {
      serial: input.unit.serial, modelCode: input.rating.modelCode, ratingName: input.rating.title,
      nameplate: input.rating.nameplate ? describeNameplate(input.rating.nameplate) : [],
    },
    disposition: DISPOSITION_WORDS[input.unit.disposition as keyof typeof DISPOSITION_WORDS] ?? input.unit.disposition,
    overall: overallOf(input.plan),
    steps,
    unitResults: unitResultsOf(input.plan),
    methods: methodsOf(input, steps),
    decisionRule: decisionRuleOf(input.profile),
    uncertaintyStatement: uncertain ? "Expanded uncertainty (k = 2, about 95 % coverage) is given beside each result where evaluated." : "Measurement uncertainty: not evaluated.",
    instruments: [...kinds.values()].map((i) => ({
      kind: i.kind, description: `${i.make} ${i.model} (asset ${i.assetTag})${i.channel ? ` on ${i.channel}` : ""}`, serial: i.serial, calibrationDue: i.calibrationDue,
    })),
    deviations: deviationsOf(input, steps),
    concession: input.unit.disposition === "accepted-with-concession" && input.remarks.concession
      ? { reason: input.remarks.concession.comment, reference: input.remarks.concession.reference ?? "" }
      : null,
    clientNotes: [...input.remarks.clientNotes],
    authorisedBy: { ...input.authorisedBy, signedAt: input.authorisedBy.signedAt.toISOString() },
    supersedes: input.supersedes,
  };
  return reportContentSchema.parse(content);
}

/** The plan state in the verdict vocabulary: complete and within is a pass, an incomplete plan is inconclusive. */
function overallOf(plan: PlanEvaluation): VerdictStatus {
  if (plan.state === "complete-within") return plan.steps.some((s) => s.record?.overall === "marginal") ? "marginal" : "pass";
  if (plan.state === "failed") return "fail";
  return "inconclusive";
}
