import { z } from "zod";

const percent = z.number().nonnegative();

/**
 * Bands and limits per check. A missing field means the check is not applicable under this
 * profile. `source` says where the numbers come from; presets are starting points to edit.
 */
export const toleranceProfileSchema = z.object({
  id: z.string().min(1),
  label: z.string().min(1),
  source: z.string().min(1),
  voltageTolerancePercent: percent.optional(),
  frequencyTolerancePercent: percent.optional(),
  thdMaxPercent: percent.optional(),
  individualHarmonicMaxPercent: percent.optional(),
  unbalanceDefinition: z.enum(["nema", "ieee", "vuf"]).default("vuf"),
  unbalanceMaxPercent: percent.optional(),
  phaseDisplacementToleranceDeg: z.number().positive().optional(),
  deviationFactorMaxPercent: percent.optional(),
  /** THF limit by rated apparent power; the first band containing the rating applies. */
  thfLimits: z.array(z.object({ minKva: z.number().nonnegative(), maxKva: z.number().positive().nullable(), maxPercent: percent })).optional(),
  tifMax: z.number().positive().optional(),
  keTolerancePercent: percent.optional(),
  expectedSequence: z.enum(["positive", "negative"]).optional(),
});

export type ToleranceProfile = z.infer<typeof toleranceProfileSchema>;

const iso8528 = (grade: "G1" | "G2" | "G3", voltage: number, frequencyBand: number): ToleranceProfile => ({
  id: `iso-8528-5-${grade.toLowerCase()}`,
  label: `Generating set, ISO 8528-5 class ${grade}`,
  source: `ISO 8528-5 performance class ${grade}: steady-state voltage ±${voltage} %, frequency band ${frequencyBand} % (used here as the allowed deviation from rated frequency), voltage unbalance 1 % — from memory, verify before relying [M ⚠]`,
  voltageTolerancePercent: voltage,
  frequencyTolerancePercent: frequencyBand,
  unbalanceDefinition: "vuf",
  unbalanceMaxPercent: 1,
  expectedSequence: "positive",
});

/** Presets from the sources in the domain notes; each is labelled and meant to be edited. */
export const tolerancePresets: ToleranceProfile[] = [
  iso8528("G1", 5, 2.5),
  iso8528("G2", 2.5, 1.5),
  iso8528("G3", 1, 0.5),
  {
    id: "genset-acceptance-ufgs",
    label: "Generator set acceptance (THD 5 %, single harmonic 3 %)",
    source: "US Unified Facilities Guide Specifications for generator sets: THD ≤ 5 %, any single harmonic ≤ 3 % at rated load [S]",
    thdMaxPercent: 5,
    individualHarmonicMaxPercent: 3,
    unbalanceDefinition: "vuf",
  },
  {
    id: "ieee-519-2014-le-1kv",
    label: "IEEE 519-2014 system voltage limits, ≤ 1 kV",
    source: "IEEE Std 519-2014 Table 1, bus voltage ≤ 1 kV: 5 % individual, 8 % THD [S]; these are system limits, not machine limits",
    thdMaxPercent: 8,
    individualHarmonicMaxPercent: 5,
    unbalanceDefinition: "vuf",
  },
  {
    id: "open-circuit-waveform",
    label: "Open-circuit waveform (deviation factor, THF, no-load THD)",
    source:
      "Deviation factor ≤ 10 % for open-circuit line-line voltage (NEMA MG 1 / IEEE 115) [M ⚠]; THF by rating 300–1000 kVA 5 %, 1–5 MVA 1.5 %, > 5 MVA 1 % (IEC 60034-1) [M ⚠]; no-load line-line THD < 1.5 % as on data sheets [CP]",
    deviationFactorMaxPercent: 10,
    thdMaxPercent: 1.5,
    thfLimits: [
      { minKva: 300, maxKva: 1000, maxPercent: 5 },
      { minKva: 1000, maxKva: 5000, maxPercent: 1.5 },
      { minKva: 5000, maxKva: null, maxPercent: 1 },
    ],
    unbalanceDefinition: "nema",
    expectedSequence: "positive",
  },
  {
    id: "pm-back-emf-bench",
    label: "Permanent-magnet back-EMF bench test",
    source: "Common practice for small PM machines: Ke within ±5 %, phase displacement within ±2°, unbalance (VUF) ≤ 1 %, THD ≤ 5 % [CP ⚠]",
    keTolerancePercent: 5,
    phaseDisplacementToleranceDeg: 2,
    unbalanceDefinition: "vuf",
    unbalanceMaxPercent: 1,
    thdMaxPercent: 5,
    frequencyTolerancePercent: 1,
    expectedSequence: "positive",
  },
  {
    id: "supply-unbalance-en-50160",
    label: "Supply voltage unbalance 2 % (EN 50160)",
    source: "EN 50160 supply voltage unbalance 2 % [M]; ANSI C84.1 recommends 3 % at the service entrance [S]",
    unbalanceDefinition: "vuf",
    unbalanceMaxPercent: 2,
  },
];
