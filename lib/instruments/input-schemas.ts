import { z } from "zod";
import { instrumentSpecSchema } from "@/lib/analysis/uncertainty";

// What the register's form and API accept. Field messages name the field; keys are the dotted paths
// the form's inputs use.

const day = (what: string) =>
  z.string().trim().regex(/^\d{4}-\d{2}-\d{2}$/, `${what} is a date, YYYY-MM-DD`).refine((s) => !Number.isNaN(Date.parse(`${s}T00:00:00Z`)), `${what} is not a calendar date`);
const optionalDay = (what: string) => z.union([z.literal("").transform(() => null), day(what)]).nullable().default(null);
const text = (what: string, max: number) => z.string({ error: `${what} is required` }).trim().min(1, `${what} is required`).max(max, `${what} is at most ${max} characters`);

export const INSTRUMENT_KINDS = ["oscilloscope", "voltage-probe", "current-probe", "daq", "tachometer"] as const;
export const INSTRUMENT_KIND_LABELS: Record<(typeof INSTRUMENT_KINDS)[number], string> = {
  oscilloscope: "Oscilloscope", "voltage-probe": "Voltage probe", "current-probe": "Current probe", daq: "DAQ unit", tachometer: "Tachometer",
};

export const instrumentInputSchema = z
  .object({
    kind: z.enum(INSTRUMENT_KINDS, { error: "Kind is one of oscilloscope, voltage-probe, current-probe, daq, tachometer" }),
    make: text("Make", 120),
    model: text("Model", 120),
    serial: text("Serial", 120),
    assetTag: text("Asset tag", 60).regex(/^[A-Za-z0-9][A-Za-z0-9._/-]*$/, "Asset tag: letters, digits and . _ / - only"),
    spec: instrumentSpecSchema.default({}),
    calibratedOn: optionalDay("Calibration date"),
    calibrationDue: optionalDay("Due date"),
    calibrationNote: z.string().trim().max(500, "Calibration note is at most 500 characters").default(""),
  })
  .refine((v) => !v.calibratedOn || !v.calibrationDue || v.calibrationDue >= v.calibratedOn, {
    path: ["calibrationDue"], message: "The due date cannot be before the calibration date",
  });
export type InstrumentInput = z.output<typeof instrumentInputSchema>;

/** An instrument named by id or asset tag, optionally on one column. */
const instrumentRef = z.union([
  z.string().trim().min(1, "An instrument is an id or an asset tag").max(80),
  z.object({ instrument: z.string().trim().min(1, "An instrument is an id or an asset tag").max(80), channel: z.string().trim().max(200).default("") }),
]);
export const instrumentRefsSchema = z.array(instrumentRef, { error: "instruments is a list of instrument ids or asset tags" }).max(32, "At most 32 instruments per capture");
export type InstrumentRefs = z.output<typeof instrumentRefsSchema>;

export const normaliseRefs = (refs: InstrumentRefs) => refs.map((r) => (typeof r === "string" ? { instrument: r, channel: "" } : r));

export const overdueConfirmationSchema = z.object({
  captureId: z.string().uuid("Unknown capture"),
  reason: z.string().trim().min(10, "Say in a sentence why the capture may still be reported (10 characters at least)").max(1000, "The reason is at most 1000 characters"),
  password: z.string().min(1, "Enter your password to sign"),
});

/** Form fields "spec.gainPercentOfReading" etc. as numbers; empty stays absent. */
export function specFromForm(form: FormData): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const key of ["gainPercentOfReading", "offset", "bandwidthHz", "timebasePpm", "speedPercentOfReading", "speedOffsetRpm", "resolutionBits"]) {
    const raw = form.get(`spec.${key}`);
    if (typeof raw === "string" && raw.trim() !== "") out[key] = Number(raw.trim());
  }
  const unit = form.get("spec.offsetUnit");
  if (typeof unit === "string" && unit !== "") out.offsetUnit = unit;
  return out;
}
