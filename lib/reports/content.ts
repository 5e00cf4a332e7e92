import { z } from "zod";

// The facts a released report was drawn from, stored with it (reports.content). The PDF, the per-unit
// CSV, the client portal and the API all read this one shape, so they never disagree with the PDF.

const verdict = z.enum(["pass", "marginal", "fail", "not-applicable", "inconclusive", "not-required"]);

export const reportCheckSchema = z.object({
  checkId: z.string(),
  label: z.string(),
  /** Harmonic order for single-harmonic rows, else null. */
  order: z.number().int().nullable(),
  value: z.number().nullable(),
  unit: z.string(),
  /** The band in words, e.g. "≤ 5.0 %" or "380 – 420 V"; "not required" with its reason. */
  limit: z.string(),
  lower: z.number().nullable(),
  upper: z.number().nullable(),
  verdict,
  /** Expanded uncertainty (k = 2) in `unit`, or null when not evaluated. */
  expandedUncertainty: z.number().nullable(),
  /** Where the band comes from (document and clause). */
  source: z.string(),
});

export const reportStepSchema = z.object({
  stepId: z.string(),
  name: z.string(),
  testKind: z.string(),
  /** The capture of record, or null when the step has none (only when released under concession). */
  capture: z
    .object({
      id: z.string(),
      fileName: z.string(),
      sha256: z.string(),
      capturedAt: z.string(),
      speedRpm: z.number().nullable(),
      magnetTemperatureC: z.number().nullable(),
      analysisVersion: z.string(),
      overall: verdict.nullable(),
    })
    .nullable(),
  checks: z.array(reportCheckSchema),
  /** Capture-quality notes and warnings, in plain words. */
  notes: z.array(z.string()),
});

const party = z.object({ name: z.string(), address: z.string() });

export const reportContentSchema = z.object({
  version: z.literal(1),
  number: z.string(),
  revision: z.number().int().positive(),
  issuedAt: z.string(),
  lab: party,
  client: party,
  unit: z.object({
    serial: z.string(),
    modelCode: z.string(),
    ratingName: z.string(),
    /** The nameplate with human labels (describeNameplate). */
    nameplate: z.array(z.object({ label: z.string(), value: z.string() })),
  }),
  disposition: z.string(),
  /** Overall against the plan, in the verdict vocabulary. */
  overall: verdict.nullable(),
  steps: z.array(reportStepSchema),
  /** Unit-level results such as Ke across speeds, as label and value with unit. */
  unitResults: z.array(z.object({ label: z.string(), value: z.string() })),
  /** Standards and clauses, and the analysis engine version. */
  methods: z.array(z.string()),
  decisionRule: z.string(),
  uncertaintyStatement: z.string(),
  instruments: z.array(z.object({ kind: z.string(), description: z.string(), serial: z.string(), calibrationDue: z.string().nullable() })),
  /** Deviations, concessions and confirmations in plain words. */
  deviations: z.array(z.string()),
  concession: z.object({ reason: z.string(), reference: z.string() }).nullable(),
  /** Notes written for the client (never internal notes). */
  clientNotes: z.array(z.string()),
  authorisedBy: z.object({ name: z.string(), role: z.string(), signedAt: z.string(), meaning: z.string() }),
  /** Set from revision 2: the number and revision replaced, and why. */
  supersedes: z.object({ revision: z.number().int(), reason: z.string() }).nullable(),
});

export type ReportContent = z.infer<typeof reportContentSchema>;
export type ReportStep = z.infer<typeof reportStepSchema>;
export type ReportCheck = z.infer<typeof reportCheckSchema>;
