import { z } from "zod";
import { decisionRuleSchema } from "./decision-rule";

/** Every check a capture can be judged on, in the order reports list them. */
export const CHECK_IDS = [
  "voltage", "frequency", "thd", "individual-harmonic", "voltage-unbalance", "phase-displacement",
  "phase-sequence", "deviation-factor", "thf", "tif", "back-emf-constant", "pole-count",
] as const;
export type CheckId = (typeof CHECK_IDS)[number];

export const CHECK_LABELS: Record<CheckId, string> = {
  voltage: "Voltage",
  frequency: "Frequency",
  thd: "Total harmonic distortion (THD)",
  "individual-harmonic": "Largest single harmonic",
  "voltage-unbalance": "Voltage unbalance",
  "phase-displacement": "Phase displacement",
  "phase-sequence": "Phase sequence",
  "deviation-factor": "Waveform deviation factor",
  thf: "Telephone harmonic factor (THF)",
  tif: "Telephone influence factor (TIF)",
  "back-emf-constant": "Back-EMF constant (Ke)",
  "pole-count": "Pole count from speed and frequency",
};

/**
 * Where a limit comes from, as a quality engineer reads it: the document, the clause, and whether
 * the number was checked against the document. Labels are explained in docs/sources.md.
 */
export const limitSourceSchema = z.object({
  document: z.string().trim().min(2, "Name the document or say \"lab's own\"").max(200),
  clause: z.string().trim().max(120).default(""),
  verified: z.boolean().default(false),
});
export type LimitSource = z.infer<typeof limitSourceSchema>;

/** "IEC 60034-1, clause 7.3 — source not verified". */
export function describeSource(source: LimitSource): string {
  const where = source.clause ? `${source.document}, ${source.clause}` : source.document;
  return source.verified ? where : `${where} — source not verified`;
}

const reason = z.string().trim().min(3, "Say why this check is not required for this rating").max(500);
const notRequired = z.object({ required: z.literal(false), reason });
const judged = <T extends z.ZodRawShape>(shape: T) => z.object({ required: z.literal(true), source: limitSourceSchema, ...shape });

const nonNegative = (what: string) => z.number({ error: `${what} must be a number` }).finite().min(0, `${what} cannot be negative`);

/** Allowed deviation from the nominal value, signed percent: lower ≤ 0 ≤ upper and lower < upper. */
const relativeBand = judged({
  lowerPercent: z.number({ error: "Lower limit must be a number" }).finite().min(-100, "Lower limit cannot be below −100 %").max(0, "Lower limit is a deviation below nominal: 0 % or less"),
  upperPercent: z.number({ error: "Upper limit must be a number" }).finite().min(0, "Upper limit is a deviation above nominal: 0 % or more").max(1000),
}).refine((b) => b.lowerPercent < b.upperPercent, { path: ["lowerPercent"], message: "The lower limit must be below the upper limit" });

const maxBand = judged({ maxPercent: nonNegative("Limit") });

const rule = <T extends z.ZodType>(band: T) => z.union([band, notRequired]);

export const checkRulesSchema = z.object({
  voltage: rule(relativeBand),
  frequency: rule(relativeBand),
  thd: rule(maxBand),
  "individual-harmonic": rule(maxBand),
  "voltage-unbalance": rule(judged({ maxPercent: nonNegative("Limit"), definition: z.enum(["nema", "ieee", "vuf"]) })),
  "phase-displacement": rule(judged({ toleranceDeg: z.number().finite().positive("The tolerance must be above 0°").max(60, "A tolerance above 60° judges nothing") })),
  "phase-sequence": rule(judged({ expected: z.enum(["positive", "negative"]) })),
  "deviation-factor": rule(maxBand),
  thf: rule(maxBand),
  tif: rule(judged({ max: nonNegative("Limit") })),
  "back-emf-constant": rule(relativeBand),
  "pole-count": rule(relativeBand),
});

export type CheckRules = z.infer<typeof checkRulesSchema>;
export type CheckRule = CheckRules[CheckId];
export type JudgedRule<K extends CheckId> = Extract<CheckRules[K], { required: true }>;

/**
 * A rating's tolerance profile: one rule for every check — a band with its source, or "not required"
 * with a reason. Nothing is left unjudged by omission. Stored as immutable versions.
 */
export const toleranceProfileSchema = z.object({
  label: z.string().trim().min(1).max(200),
  /** The preset it started from (see tolerance-presets.ts). */
  presetId: z.string().min(1).max(80),
  /** Inside a band but within this share of the distance from nominal to the limit: "marginal". */
  marginalZonePercent: z.number().finite().min(0, "The marginal zone cannot be negative").max(100, "The marginal zone is a share of the band: 100 % at most").default(10),
  /** Highest harmonic order summed (IEEE 519 uses 50, IEC 61000-4-7 40). */
  harmonicOrder: z.number().int().min(2).max(200).default(50),
  /** Measured voltage or Ke this many times off the rated value is implausible (probe ratio, roles, units). */
  plausibilityFactor: z.number().finite().min(1.1, "The plausibility factor must exceed 1.1").max(100).default(3),
  /**
   * Profile v2: how U enters the verdict (decision-rule.ts). Profiles stored before it read as
   * "simple", the rule they were judged by.
   */
  decisionRule: decisionRuleSchema.default("simple"),
  checks: checkRulesSchema,
});

export type ToleranceProfile = z.infer<typeof toleranceProfileSchema>;
export type ToleranceProfileInput = z.input<typeof toleranceProfileSchema>;
