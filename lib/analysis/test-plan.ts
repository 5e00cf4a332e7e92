import { z } from "zod";
import { CHANNEL_ROLES } from "./types";
import { CHECK_IDS } from "./tolerance";

export const TEST_KINDS = ["no-load", "load", "back-emf", "other"] as const;
export type TestKind = (typeof TEST_KINDS)[number];

/**
 * One step of a rating's test plan: the captures a unit must have to be complete. A capture belongs
 * to a step when its test kind matches and its shaft speed lies in the window.
 */
export const planStepSchema = z
  .object({
    name: z.string().trim().min(2, "Name the step").max(120),
    testKind: z.enum(TEST_KINDS),
    speedMinRpm: z.number({ error: "Lowest speed must be a number" }).finite().min(1, "Shaft speed starts at 1 rpm"),
    speedMaxRpm: z.number({ error: "Highest speed must be a number" }).finite().max(200_000),
    /** Channel roles a capture of this step must carry. */
    requiredRoles: z.array(z.enum(CHANNEL_ROLES)).max(10).default([]),
    /** The checks of the rating's profile that decide this step. */
    checks: z.array(z.enum(CHECK_IDS)).min(1, "Pick at least one check for the step").max(CHECK_IDS.length),
  })
  .refine((s) => s.speedMinRpm < s.speedMaxRpm, { path: ["speedMaxRpm"], message: "The speed window is empty: the highest speed must be above the lowest" });

export type PlanStep = z.infer<typeof planStepSchema>;
export type PlanStepInput = z.input<typeof planStepSchema>;

/** Speed window of ±percent around a speed, as plans usually state it ("rated speed ± 2 %"). */
export function speedWindow(speedRpm: number, percent: number): { speedMinRpm: number; speedMaxRpm: number } {
  return { speedMinRpm: speedRpm * (1 - percent / 100), speedMaxRpm: speedRpm * (1 + percent / 100) };
}

/** Whether a capture of this kind and speed belongs to the step. */
export function captureFitsStep(step: Pick<PlanStep, "testKind" | "speedMinRpm" | "speedMaxRpm">, capture: { testKind: string; speedRpm: number | null }): boolean {
  return capture.testKind === step.testKind && capture.speedRpm !== null && capture.speedRpm >= step.speedMinRpm && capture.speedRpm <= step.speedMaxRpm;
}

/**
 * The step a capture counts for: the one chosen for it when that step is still in the plan, else the
 * first step whose test kind and speed window fit. Null when none fits.
 */
export function matchPlanStep<S extends { id: string } & Pick<PlanStep, "testKind" | "speedMinRpm" | "speedMaxRpm">>(
  steps: readonly S[],
  capture: { testKind: string; speedRpm: number | null; planStepId: string | null },
): S | null {
  if (capture.planStepId) {
    const chosen = steps.find((s) => s.id === capture.planStepId);
    if (chosen) return chosen;
  }
  return steps.find((s) => captureFitsStep(s, capture)) ?? null;
}
