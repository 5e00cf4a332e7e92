import { z } from "zod";

/** A machine rating as stored (JSONB) with a unit; the basis of every verdict. */
export const ratingSchema = z.object({
  nominalVoltageV: z.number().positive(),
  voltageBasis: z.enum(["line-line-rms", "line-neutral-rms"]),
  frequencyHz: z.number().positive(),
  phases: z.union([z.literal(1), z.literal(2), z.literal(3)]),
  connection: z.enum(["star", "delta", "single"]),
  poles: z.number().int().positive().multipleOf(2),
  ratedSpeedRpm: z.number().positive(),
  /** Back-EMF constant, V_LL,rms per 1000 rpm. */
  keLineRmsPerKrpm: z.number().positive().optional(),
  ratedKva: z.number().positive().optional(),
});

export type Rating = z.infer<typeof ratingSchema>;
