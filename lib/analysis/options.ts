import { z } from "zod";
import { ratingSchema } from "./rating";
import { channelRoleSchema } from "./report-schema";
import { CHECK_IDS, toleranceProfileSchema } from "./tolerance";
import { uncertaintyInstrumentSchema } from "./uncertainty";

export const analysisOptionsSchema = z.object({
  /** Keyed by column header as written; missing channels take the roles suggested from headers. */
  channelRoles: z.record(z.string(), channelRoleSchema).optional(),
  /** Shaft speed; below 1 rpm no figure that scales with speed means anything. */
  speedRpm: z.number({ error: "Shaft speed must be a number" }).finite().min(1, "Shaft speed starts at 1 rpm").max(200_000, "Shaft speed is above 200 000 rpm").optional(),
  poles: z.number().int().positive().optional(),
  /** Highest harmonic order (IEEE 519 uses 50, IEC 61000-4-7 40). */
  harmonics: z.number().int().min(2).max(200).default(50),
  rating: ratingSchema.optional(),
  /** The rating's tolerance profile; verdicts need both a rating and a profile. */
  profile: toleranceProfileSchema.optional(),
  /** The plan step's checks (the others are not required for this capture) and its name. */
  checks: z.array(z.enum(CHECK_IDS)).optional(),
  stepName: z.string().optional(),
  /** The instruments that took the capture, with their accuracy specifications (uncertainty budgets). */
  instruments: z.array(uncertaintyInstrumentSchema).optional(),
  groupingIec: z.boolean().default(false),
  deviationBasis: z.enum(["average-cycle", "worst-cycle"]).default("average-cycle"),
  /** Magnet temperature during a back-EMF test, to state Ke at a reference temperature. */
  magnetTemperature: z
    .object({
      measuredC: z.number(),
      referenceC: z.number().default(20),
      /** Overrides the material's coefficient, percent per kelvin (negative for usual magnets). */
      coefficientPercentPerK: z.number().optional(),
      material: z.enum(["ndfeb", "smco", "ferrite"]).default("ndfeb"),
    })
    .optional(),
});

export type AnalysisOptions = z.input<typeof analysisOptionsSchema>;
export type ResolvedAnalysisOptions = z.output<typeof analysisOptionsSchema>;
