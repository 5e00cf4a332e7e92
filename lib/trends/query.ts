import { z } from "zod";
import { TEST_KINDS } from "@/lib/captures/input-schemas";
import { CHECK_IDS, CHECK_LABELS, type CheckId } from "@/lib/analysis";
import { HARMONIC_FIGURE, MAX_TREND_HARMONIC } from "./figure-rows";

/** Figures a trend can show: every numeric check, and any single harmonic order. */
export const TREND_FIGURES = [...CHECK_IDS.filter((c) => c !== "phase-sequence"), HARMONIC_FIGURE] as const;
export type TrendFigure = (typeof TREND_FIGURES)[number];

export const TREND_FIGURE_LABELS: Record<TrendFigure, string> = {
  ...(Object.fromEntries(CHECK_IDS.filter((c) => c !== "phase-sequence").map((c) => [c, CHECK_LABELS[c]])) as Record<Exclude<CheckId, "phase-sequence">, string>),
  [HARMONIC_FIGURE]: "Single harmonic order",
};

/** The plan check that decides which capture is a unit's record for the figure. */
export const checkOfFigure = (figure: TrendFigure): CheckId => (figure === HARMONIC_FIGURE ? "individual-harmonic" : figure);

const blankToUndefined = (v: unknown) => (v === "" || v === null ? undefined : v);
const day = (what: string) => z.preprocess(blankToUndefined, z.string().regex(/^\d{4}-\d{2}-\d{2}$/, `${what} must be a date written YYYY-MM-DD`)
  // A calendar day (no 30 February rolled into March) within a range the database and the export can write.
  .refine((s) => { const t = Date.parse(`${s}T00:00:00Z`); return Number.isFinite(t) && new Date(t).toISOString().slice(0, 10) === s && s >= "1970-01-01" && s <= "2999-12-31"; },
    `${what} is not a calendar date between 1970 and 2999`).optional());
const id = (what: string) => z.preprocess(blankToUndefined, z.uuid(`${what} is not a known id`).optional());

/** The trends page's URL (and its CSV export's): shared so a filtered view can be bookmarked and exported. */
export const trendQuerySchema = z.object({
  rating: id("Model"),
  figure: z.preprocess(blankToUndefined, z.enum(TREND_FIGURES, `Figure must be one of ${TREND_FIGURES.join(", ")}`).default("voltage")),
  order: z.preprocess(blankToUndefined, z.coerce.number({ error: "Harmonic order must be a whole number" }).int("Harmonic order must be a whole number")
    .min(2, "Harmonic order starts at 2").max(MAX_TREND_HARMONIC, `Harmonic order goes up to ${MAX_TREND_HARMONIC}`).default(5)),
  from: day("From"),
  to: day("To"),
  client: id("Client"),
  kind: z.preprocess(blankToUndefined, z.enum(TEST_KINDS, `Test kind must be one of ${TEST_KINDS.join(", ")}`).optional()),
  bench: id("Bench"),
  instrument: id("Instrument"),
  x: z.preprocess(blankToUndefined, z.enum(["serial", "date"], "Order by serial or date").default("serial")),
}).refine((q) => !q.from || !q.to || q.from <= q.to, { path: ["to"], message: "To must not be before From" });

export type TrendQuery = z.output<typeof trendQuerySchema>;

/** Parses URL search parameters (first value of each); a bad one is named in `errors`. */
export function parseTrendQuery(params: Record<string, string | string[] | undefined> | URLSearchParams) {
  const flat = params instanceof URLSearchParams ? Object.fromEntries(params.entries())
    : Object.fromEntries(Object.entries(params).map(([k, v]) => [k, Array.isArray(v) ? v[0] : v]));
  const parsed = trendQuerySchema.safeParse(flat);
  if (parsed.success) return { query: parsed.data, errors: [] as string[] };
  return { query: null, errors: parsed.error.issues.map((i) => `${String(i.path[0] ?? "query")}: ${i.message}`) };
}

/** The same query back as URL parameters (defaults and blanks left out). */
export function trendQueryString(q: Partial<TrendQuery>): string {
  const out = new URLSearchParams();
  for (const [k, v] of Object.entries(q)) if (v !== undefined && v !== "") out.set(k, String(v));
  return out.toString();
}
