import { z } from "zod";

export const MACHINE_KINDS = ["wound-field-alternator", "pm-generator", "pm-motor-back-emf"] as const;
export type MachineKind = (typeof MACHINE_KINDS)[number];

export const MACHINE_KIND_LABELS: Record<MachineKind, string> = {
  "wound-field-alternator": "Wound-field alternator",
  "pm-generator": "Permanent-magnet generator",
  "pm-motor-back-emf": "Permanent-magnet motor (back-EMF test)",
};

export const VOLTAGE_BASES = ["line-line-rms", "line-neutral-rms"] as const;
export const VOLTAGE_BASIS_LABELS: Record<(typeof VOLTAGE_BASES)[number], string> = {
  "line-line-rms": "line-to-line, RMS",
  "line-neutral-rms": "line-to-neutral, RMS",
};

export const CONNECTIONS = ["star", "delta", "single"] as const;
export const CONNECTION_LABELS: Record<(typeof CONNECTIONS)[number], string> = { star: "Star (wye)", delta: "Delta", single: "Single-phase" };

/**
 * Bases of a back-EMF constant. Conventions differ between makers, so the rating states its own
 * and verdicts convert the measurement to it (DOMAIN §1).
 */
export const KE_BASES = ["line-line-rms-per-krpm", "line-line-peak-per-krpm", "phase-rms-per-krpm", "phase-peak-per-rad-s"] as const;
export type KeBasis = (typeof KE_BASES)[number];
export const KE_BASIS_LABELS: Record<KeBasis, string> = {
  "line-line-rms-per-krpm": "V (line-to-line RMS) per 1000 rpm",
  "line-line-peak-per-krpm": "V (line-to-line peak) per 1000 rpm",
  "phase-rms-per-krpm": "V (phase RMS) per 1000 rpm",
  "phase-peak-per-rad-s": "V (phase peak) per rad/s",
};
export const KE_BASIS_UNITS: Record<KeBasis, string> = {
  "line-line-rms-per-krpm": "V/krpm",
  "line-line-peak-per-krpm": "V/krpm",
  "phase-rms-per-krpm": "V/krpm",
  "phase-peak-per-rad-s": "V·s/rad",
};

export const MAGNET_MATERIALS = ["ndfeb", "smco", "ferrite"] as const;
export const MAGNET_MATERIAL_LABELS: Record<(typeof MAGNET_MATERIALS)[number], string> = { ndfeb: "NdFeB", smco: "SmCo", ferrite: "Ferrite" };

const positive = (what: string) => z.number({ error: `${what} must be a number` }).positive(`${what} must be above zero`).finite();

/** A machine rating (nameplate) as stored with a rating: the basis of every verdict. */
export const ratingSchema = z
  .object({
    machineKind: z.enum(MACHINE_KINDS),
    phases: z.union([z.literal(1), z.literal(2), z.literal(3)]),
    connection: z.enum(CONNECTIONS),
    poles: z.number().int("Poles must be a whole number").positive("Poles must be above zero").multipleOf(2, "Poles come in pairs: give an even number"),
    ratedSpeedRpm: positive("Rated speed").max(200_000, "Rated speed is above 200 000 rpm"),
    nominalVoltageV: positive("Rated voltage"),
    voltageBasis: z.enum(VOLTAGE_BASES),
    frequencyHz: positive("Rated frequency"),
    ratedKva: positive("Rated apparent power").optional(),
    ratedKw: positive("Rated power").optional(),
    /** Nominal back-EMF constant with its basis: required for permanent-magnet machines. */
    ke: z.object({ value: positive("Nominal Ke"), basis: z.enum(KE_BASES) }).optional(),
    magnetMaterial: z.enum(MAGNET_MATERIALS).optional(),
    /** Magnet temperature the nominal Ke refers to, °C. */
    magnetReferenceC: z.number().min(-60).max(250).optional(),
  })
  .superRefine((r, ctx) => {
    const pm = r.machineKind !== "wound-field-alternator";
    if (pm && !r.ke) ctx.addIssue({ code: "custom", path: ["ke"], message: "A permanent-magnet machine needs its nominal Ke and basis" });
    if (!pm && r.ke) ctx.addIssue({ code: "custom", path: ["ke"], message: "A wound-field alternator has no back-EMF constant: leave Ke empty" });
    if (!pm && (r.magnetMaterial || r.magnetReferenceC !== undefined)) ctx.addIssue({ code: "custom", path: ["magnetMaterial"], message: "Magnet data applies to permanent-magnet machines only" });
    if (r.phases === 1 && r.connection !== "single") ctx.addIssue({ code: "custom", path: ["connection"], message: "A single-phase machine has the single-phase connection" });
    if (r.phases !== 1 && r.connection === "single") ctx.addIssue({ code: "custom", path: ["connection"], message: "Choose star or delta for a machine with more than one phase" });
    if (r.phases === 1 && r.voltageBasis !== "line-neutral-rms") ctx.addIssue({ code: "custom", path: ["voltageBasis"], message: "A single-phase machine's voltage is stated across its one winding (line-to-neutral)" });
    if (r.phases === 1 && r.ke && r.ke.basis.startsWith("line-line")) ctx.addIssue({ code: "custom", path: ["ke", "basis"], message: "A single-phase machine's Ke is per phase, not line-to-line" });
    // f = p·n/120 for a synchronous machine (DOMAIN §1); 1 % slack for rounded nameplates.
    const implied = (r.poles * r.ratedSpeedRpm) / 120;
    if (Math.abs(implied - r.frequencyHz) > 0.01 * r.frequencyHz) {
      ctx.addIssue({ code: "custom", path: ["frequencyHz"], message: `${r.poles} poles at ${r.ratedSpeedRpm} rpm give ${implied.toPrecision(4)} Hz (f = p·n/120), not ${r.frequencyHz} Hz` });
    }
  });

export type Rating = z.infer<typeof ratingSchema>;

/** Kinds whose rotor carries permanent magnets: their Ke is a rated figure. */
export function isPermanentMagnet(rating: Pick<Rating, "machineKind">): boolean {
  return rating.machineKind !== "wound-field-alternator";
}
