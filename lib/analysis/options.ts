import { z } from "zod";
import { ratingSchema } from "./rating";
import { channelRoleSchema } from "./report-schema";
import { toleranceProfileSchema } from "./tolerance";

export const analysisOptionsSchema = z.object({
  /** Keyed by column header as written; missing channels take the roles suggested from headers. */
  channelRoles: z.record(z.string(), channelRoleSchema).optional(),
  speedRpm: z.number().positive().optional(),
  poles: z.number().int().positive().optional(),
  /** Highest harmonic order (IEEE 519 uses 50, IEC 61000-4-7 40). */
  harmonics: z.number().int().min(2).max(200).default(50),
  rating: ratingSchema.optional(),
  tolerance: toleranceProfileSchema.optional(),
  /** A pass within this percent of the distance from nominal to a limit is "marginal". */
  marginalGuardPercent: z.number().min(0).max(100).default(10),
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
