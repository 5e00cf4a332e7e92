import { z } from "zod";

// Type B measurement uncertainty from the makers' accuracy specifications (GUM, JCGM 100:2008 §4.3):
// a stated limit ±a read as a rectangular distribution gives u = a/√3; the combined standard
// uncertainty is u_c = √Σ(c_i·u_i)²; the expanded uncertainty U = k·u_c with k = 2. Pure: no I/O.

export const COVERAGE_FACTOR = 2;
export const COVERAGE_STATEMENT = "k = 2, about 95 % coverage (normal distribution of the combined result assumed)";

const nonNegative = (what: string) => z.number({ error: `${what} must be a number` }).finite(`${what} must be a finite number`).min(0, `${what} cannot be negative`);

/** An instrument's accuracy specification as the maker states it; every term optional. */
export const instrumentSpecSchema = z.object({
  gainPercentOfReading: nonNegative("Gain accuracy").max(100, "Gain accuracy above 100 % of reading measures nothing").optional(),
  offset: nonNegative("Offset").optional(),
  offsetUnit: z.enum(["V", "A", "rpm"], { error: "Offset unit is V, A or rpm" }).optional(),
  bandwidthHz: z.number({ error: "Bandwidth must be a number" }).finite().positive("Bandwidth must be above 0 Hz").optional(),
  timebasePpm: nonNegative("Timebase accuracy").max(1e5, "Timebase accuracy above 100 000 ppm measures nothing").optional(),
  speedPercentOfReading: nonNegative("Speed-reading accuracy").max(100, "Speed-reading accuracy above 100 % of reading measures nothing").optional(),
  speedOffsetRpm: nonNegative("Speed-reading offset").optional(),
  resolutionBits: z.number().int().min(1).max(32).optional(),
});
export type InstrumentSpecInput = z.infer<typeof instrumentSpecSchema>;

export const UNCERTAINTY_INSTRUMENT_KINDS = ["oscilloscope", "voltage-probe", "current-probe", "daq", "tachometer"] as const;

/** One instrument that took the capture, as the engine needs it (the register keeps the rest). */
export const uncertaintyInstrumentSchema = z.object({
  assetTag: z.string(),
  kind: z.enum(UNCERTAINTY_INSTRUMENT_KINDS),
  /** The column it measured, or "" for the whole capture. */
  channel: z.string().default(""),
  spec: instrumentSpecSchema,
});
export type UncertaintyInstrument = z.input<typeof uncertaintyInstrumentSchema>;

export const contributionSchema = z.object({
  name: z.string(),
  /** The stated half-width ±a, in `unit`. */
  value: z.number(),
  unit: z.string(),
  distribution: z.enum(["rectangular"]),
  divisor: z.number(),
  /** ∂(measurand)/∂(input): 1 for a term read in the measurand's own unit. */
  sensitivity: z.number(),
  /** |c_i|·u_i in the measurand's unit. */
  standardUncertainty: z.number(),
  /** (c_i·u_i)² / u_c², 0 to 1. */
  share: z.number(),
});
export type Contribution = z.infer<typeof contributionSchema>;

export const UNCERTAINTY_FIGURES = ["voltage", "frequency", "back-emf-constant"] as const;
export type UncertaintyFigure = (typeof UNCERTAINTY_FIGURES)[number];

export const figureUncertaintySchema = z.discriminatedUnion("status", [
  z.object({
    check: z.enum(UNCERTAINTY_FIGURES),
    status: z.literal("evaluated"),
    value: z.number(),
    unit: z.string(),
    standardUncertainty: z.number(),
    expandedUncertainty: z.number(),
    /** U relative to the value, in percent. */
    relativePercent: z.number(),
    coverageFactor: z.number(),
    contributions: z.array(contributionSchema),
    /** Terms the specifications do not state, so they contribute nothing (named, not hidden). */
    omitted: z.array(z.string()),
  }),
  z.object({ check: z.enum(UNCERTAINTY_FIGURES), status: z.literal("not-evaluated"), reason: z.string() }),
]);
export type FigureUncertainty = z.infer<typeof figureUncertaintySchema>;

export const uncertaintySectionSchema = z.object({
  method: z.string(),
  coverage: z.string(),
  instruments: z.array(uncertaintyInstrumentSchema),
  figures: z.array(figureUncertaintySchema),
});
export type UncertaintySection = z.infer<typeof uncertaintySectionSchema>;

type Term = { name: string; value: number; unit: string; sensitivity: number };

/** Combines stated limits ±a (rectangular, divisor √3) with their sensitivities into u_c and U = k·u_c. */
export function combine(terms: readonly Term[], k = COVERAGE_FACTOR): { standardUncertainty: number; expandedUncertainty: number; contributions: Contribution[] } {
  const divisor = Math.sqrt(3);
  const parts = terms.map((t) => ({ ...t, u: Math.abs(t.sensitivity) * (t.value / divisor) }));
  const variance = parts.reduce((sum, p) => sum + p.u * p.u, 0);
  const uc = Math.sqrt(variance);
  return {
    standardUncertainty: uc,
    expandedUncertainty: k * uc,
    contributions: parts.map((p) => ({
      name: p.name, value: p.value, unit: p.unit, distribution: "rectangular", divisor, sensitivity: p.sensitivity,
      standardUncertainty: p.u, share: variance > 0 ? (p.u * p.u) / variance : 0,
    })),
  };
}

const applies = (instrument: UncertaintyInstrument, channels: readonly string[]) => !instrument.channel || channels.includes(instrument.channel);
const label = (i: UncertaintyInstrument) => `${i.assetTag} (${i.kind})`;
const VOLTAGE_KINDS = new Set(["oscilloscope", "daq", "voltage-probe"]);
const TIMEBASE_KINDS = new Set(["oscilloscope", "daq"]);

/** Gain (% of reading) and offset terms of the voltage path at `volts`, each with sensitivity `c`. */
function voltageTerms(instruments: readonly UncertaintyInstrument[], channels: readonly string[], volts: number, c: number, omitted: string[]): Term[] {
  const out: Term[] = [];
  for (const i of instruments) {
    if (!VOLTAGE_KINDS.has(i.kind) || !applies(i, channels)) continue;
    if (i.spec.gainPercentOfReading !== undefined) out.push({ name: `${label(i)} gain ±${i.spec.gainPercentOfReading} % of reading`, value: (Math.abs(volts) * i.spec.gainPercentOfReading) / 100, unit: "V", sensitivity: c });
    else omitted.push(`${label(i)}: no gain accuracy stated`);
    if (i.spec.offset !== undefined && (i.spec.offsetUnit ?? "V") === "V") out.push({ name: `${label(i)} offset ±${i.spec.offset} V`, value: i.spec.offset, unit: "V", sensitivity: c });
    if (i.kind !== "voltage-probe" && i.spec.resolutionBits !== undefined) omitted.push(`${label(i)}: resolution needs the range (V/div), which the capture does not state`);
  }
  return out;
}

function evaluated(check: UncertaintyFigure, value: number, unit: string, terms: Term[], omitted: string[]): FigureUncertainty {
  const { standardUncertainty, expandedUncertainty, contributions } = combine(terms);
  return {
    check, status: "evaluated", value, unit, standardUncertainty, expandedUncertainty,
    relativePercent: value !== 0 ? (100 * expandedUncertainty) / Math.abs(value) : 0,
    coverageFactor: COVERAGE_FACTOR, contributions, omitted,
  };
}

const notEvaluated = (check: UncertaintyFigure, reason: string): FigureUncertainty => ({ check, status: "not-evaluated", reason });

/** The figures the budget is drawn for, as the judgement computed them. */
export type UncertaintyInputs = {
  voltage: { value: number | null; unit: string; channels: readonly string[] };
  frequency: { value: number | null; unit: string };
  /** Ke in the rating's basis with the line voltage and speed it came from. */
  ke: { value: number | null; unit: string; voltageV: number | null; speedRpm: number | null; channels: readonly string[] };
};

/**
 * RMS voltage, frequency and Ke with their type B budgets. Each instrument contributes once to a figure
 * (a scope's gain error is taken as fully correlated across its channels, the cautious reading).
 * Without recorded instruments, or without a stated term for an input quantity, the figure is
 * "not evaluated" with the reason — never an uncertainty of zero.
 */
export function evaluateUncertainty(inputs: UncertaintyInputs, instrumentList: readonly UncertaintyInstrument[]): FigureUncertainty[] {
  const instruments = instrumentList.map((i) => uncertaintyInstrumentSchema.parse(i));
  if (instruments.length === 0) return UNCERTAINTY_FIGURES.map((check) => notEvaluated(check, "no instruments recorded for this capture"));
  const out: FigureUncertainty[] = [];

  const v = inputs.voltage;
  if (v.value === null || !Number.isFinite(v.value)) out.push(notEvaluated("voltage", "no voltage figure"));
  else {
    const omitted: string[] = [];
    const terms = voltageTerms(instruments, v.channels, v.value, 1, omitted);
    out.push(terms.length > 0 ? evaluated("voltage", v.value, v.unit, terms, omitted) : notEvaluated("voltage", "no recorded instrument states a voltage gain or offset accuracy"));
  }

  const f = inputs.frequency;
  const clocks = instruments.filter((i) => TIMEBASE_KINDS.has(i.kind) && i.spec.timebasePpm !== undefined);
  if (f.value === null || !Number.isFinite(f.value)) out.push(notEvaluated("frequency", "no frequency figure"));
  else if (clocks.length === 0) out.push(notEvaluated("frequency", "no recorded oscilloscope or DAQ states a timebase accuracy"));
  else {
    // Only the sampling clock of the capture matters: the least accurate stated one, cautiously.
    const worst = clocks.reduce((a, b) => ((b.spec.timebasePpm ?? 0) > (a.spec.timebasePpm ?? 0) ? b : a));
    const ppm = worst.spec.timebasePpm as number;
    out.push(evaluated("frequency", f.value, f.unit, [{ name: `${label(worst)} timebase ±${ppm} ppm`, value: (Math.abs(f.value) * ppm) / 1e6, unit: f.unit, sensitivity: 1 }], []));
  }

  const ke = inputs.ke;
  if (ke.value === null || ke.voltageV === null || ke.speedRpm === null || !(ke.voltageV > 0) || !(ke.speedRpm > 0)) out.push(notEvaluated("back-emf-constant", "no back-EMF constant (no speed given or no voltage)"));
  else {
    const omitted: string[] = [];
    // Ke = V/n (any basis is a constant multiple): c_V = Ke/V per volt, c_n = −Ke/n per rpm.
    const voltage = voltageTerms(instruments, ke.channels, ke.voltageV, ke.value / ke.voltageV, omitted);
    const speed: Term[] = [];
    for (const t of instruments.filter((i) => i.kind === "tachometer")) {
      const cn = -ke.value / ke.speedRpm;
      if (t.spec.speedPercentOfReading !== undefined) speed.push({ name: `${label(t)} speed ±${t.spec.speedPercentOfReading} % of reading`, value: (ke.speedRpm * t.spec.speedPercentOfReading) / 100, unit: "rpm", sensitivity: cn });
      if (t.spec.speedOffsetRpm !== undefined) speed.push({ name: `${label(t)} speed offset ±${t.spec.speedOffsetRpm} rpm`, value: t.spec.speedOffsetRpm, unit: "rpm", sensitivity: cn });
    }
    if (voltage.length === 0) out.push(notEvaluated("back-emf-constant", "no recorded instrument states a voltage gain or offset accuracy"));
    else if (speed.length === 0) out.push(notEvaluated("back-emf-constant", "no recorded tachometer states a speed-reading accuracy"));
    else out.push(evaluated("back-emf-constant", ke.value, ke.unit, [...voltage, ...speed], omitted));
  }
  return out;
}

/** "± 1.23 V (0.31 %)" or "not evaluated"; the page and the report word U alike. */
export function describeUncertainty(u: FigureUncertainty | undefined): string {
  if (!u || u.status !== "evaluated") return "not evaluated";
  const digits = (x: number) => Number(x.toPrecision(2)).toString();
  return `± ${digits(u.expandedUncertainty)}${u.unit ? ` ${u.unit}` : ""} (${digits(u.relativePercent)} %, k = ${u.coverageFactor})`;
}
