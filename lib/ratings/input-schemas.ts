import { z } from "zod";
import {
  CHANNEL_ROLES, CHECK_IDS, KE_BASES, MACHINE_KINDS, MAGNET_MATERIALS, PRESET_IDS, planStepSchema, ratingSchema, TEST_KINDS, toleranceProfileSchema,
} from "@/lib/analysis";

// Inputs of the lab set-up pages and the ratings API, each with a message per field. The API and the
// server actions parse with the same schemas (the actions first turn form fields into these shapes).

const text = (what: string, max: number) => z.string({ error: `${what} is required` }).trim().min(1, `${what} is required`).max(max, `${what} is at most ${max} characters`);

export const clientInputSchema = z.object({
  name: text("Name", 160).refine((s) => s.length >= 2, "Name the client (2 characters or more)"),
  address: z.string().trim().max(500, "The address is at most 500 characters").default(""),
  contactEmail: z.union([z.literal(""), z.email("Enter a valid contact e-mail address").max(254)]).default(""),
  referenceCode: z.string().trim().max(60, "The reference code is at most 60 characters").default(""),
});
export type ClientInput = z.infer<typeof clientInputSchema>;

const ratingFields = {
  modelCode: text("Model code", 60).regex(/^[A-Za-z0-9][A-Za-z0-9 ._/-]*$/, "Model code: letters, digits, space, . _ / - only"),
  title: text("Title", 160),
  nameplate: ratingSchema,
};

export const ratingCreateSchema = z.object({
  clientId: z.uuid("Pick the client whose model this is"),
  ...ratingFields,
  presetId: z.enum(PRESET_IDS, { error: "Pick the preset the tolerance profile starts from" }),
});
export type RatingCreateInput = z.infer<typeof ratingCreateSchema>;

/** Edits of a rating: any of model code, title and nameplate (the nameplate is replaced whole). */
export const ratingPatchSchema = z.object(ratingFields).partial().refine((p) => Object.keys(p).length > 0, { message: "Send at least one of modelCode, title, nameplate" });
export type RatingPatchInput = z.infer<typeof ratingPatchSchema>;

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export const ratingListQuerySchema = z.object({
  client: z.string().optional().refine((v) => !v || UUID.test(v), "client must be a client id").transform((v) => v || undefined),
  kind: z.enum(["", ...MACHINE_KINDS], { error: `kind must be one of ${MACHINE_KINDS.join(", ")}` }).optional().transform((v) => v || undefined),
  retired: z.enum(["active", "retired", "all"], { error: "retired must be active, retired or all" }).default("active"),
});
export type RatingListQuery = z.infer<typeof ratingListQuerySchema>;

export const profileVersionSchema = z.object({
  profile: toleranceProfileSchema,
  reason: z.string({ error: "Say why the profile changes" }).trim().min(3, "Say why the profile changes (3 characters or more)").max(500, "The reason is at most 500 characters"),
});
export type ProfileVersionInput = z.infer<typeof profileVersionSchema>;

/** A plan step as sent: a speed window as min/max rpm, or as a speed ± percent. */
export const planStepInputSchema = z
  .object({
    id: z.uuid("id must be the id of a step of this plan").optional(),
    name: z.string().default(""),
    testKind: z.enum(TEST_KINDS, { error: "Pick the test kind" }),
    speedMinRpm: z.number({ error: "Lowest speed must be a number" }).optional(),
    speedMaxRpm: z.number({ error: "Highest speed must be a number" }).optional(),
    speedRpm: z.number({ error: "Speed must be a number" }).finite().min(1, "Shaft speed starts at 1 rpm").optional(),
    speedTolerancePercent: z.number({ error: "Speed tolerance must be a number" }).finite().optional(),
    requiredRoles: z.array(z.enum(CHANNEL_ROLES, { error: "Unknown channel role" })).default([]),
    checks: z.array(z.enum(CHECK_IDS, { error: "Unknown check" })).default([]),
  })
  .superRefine((s, ctx) => {
    if (s.speedRpm !== undefined || s.speedTolerancePercent !== undefined) {
      if (s.speedRpm === undefined) ctx.addIssue({ code: "custom", path: ["speedRpm"], message: "Give the speed the window is centred on" });
      if (s.speedTolerancePercent === undefined) ctx.addIssue({ code: "custom", path: ["speedTolerancePercent"], message: "Give the speed tolerance, %" });
      else if (s.speedTolerancePercent <= 0) ctx.addIssue({ code: "custom", path: ["speedTolerancePercent"], message: "The speed window is empty: give a tolerance above 0 %" });
      else if (s.speedTolerancePercent >= 100) ctx.addIssue({ code: "custom", path: ["speedTolerancePercent"], message: "A tolerance of 100 % or more reaches standstill" });
    }
  })
  .transform((s, ctx) => {
    const window = s.speedRpm !== undefined && s.speedTolerancePercent !== undefined
      ? { speedMinRpm: s.speedRpm * (1 - s.speedTolerancePercent / 100), speedMaxRpm: s.speedRpm * (1 + s.speedTolerancePercent / 100) }
      : { speedMinRpm: s.speedMinRpm, speedMaxRpm: s.speedMaxRpm };
    const step = planStepSchema.safeParse({ name: s.name, testKind: s.testKind, ...window, requiredRoles: s.requiredRoles, checks: s.checks });
    if (!step.success) {
      for (const issue of step.error.issues) ctx.addIssue({ code: "custom", path: issue.path, message: issue.message });
      return z.NEVER;
    }
    return { ...step.data, id: s.id };
  });
export type PlanStepInput = z.infer<typeof planStepInputSchema>;

export const planPutSchema = z.object({
  steps: z.array(planStepInputSchema).max(30, "A plan has at most 30 steps"),
  reason: z.string().trim().max(500).default(""),
});

export const rejudgeSchema = z.object({ ratingId: z.uuid() });

export { KE_BASES, MAGNET_MATERIALS };
