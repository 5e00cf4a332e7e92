import { sql } from "drizzle-orm";
import {
  bigint, boolean, date, doublePrecision, index, integer, jsonb, pgEnum, pgTable, primaryKey, text, timestamp, uniqueIndex, uuid,
} from "drizzle-orm/pg-core";
import { analyses, captures, organisations, planSteps, ratings, stations, units, users, verdictStatus } from "./core";

// Instruments, their calibration, and the per-figure rows trends are computed from.

const createdAt = () => timestamp("created_at", { withTimezone: true }).notNull().defaultNow();

export const instrumentKind = pgEnum("instrument_kind", ["oscilloscope", "voltage-probe", "current-probe", "daq", "tachometer"]);

/**
 * Accuracy specification as the maker states it. Gains are % of reading; offsets are in the unit the
 * instrument reads (V, A, rpm); all optional, a missing one contributes nothing and is named in the budget.
 */
export type InstrumentSpec = {
  gainPercentOfReading?: number;
  offset?: number;
  offsetUnit?: "V" | "A" | "rpm";
  bandwidthHz?: number;
  timebasePpm?: number;
  speedPercentOfReading?: number;
  speedOffsetRpm?: number;
  resolutionBits?: number;
};

export const instruments = pgTable(
  "instruments",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    labId: uuid("lab_id").notNull().references(() => organisations.id),
    kind: instrumentKind("kind").notNull(),
    make: text("make").notNull(),
    model: text("model").notNull(),
    serial: text("serial").notNull(),
    assetTag: text("asset_tag").notNull(),
    spec: jsonb("spec").$type<InstrumentSpec>().notNull().default({}),
    calibratedOn: date("calibrated_on", { mode: "string" }),
    calibrationDue: date("calibration_due", { mode: "string" }),
    /** Free text from the certificate: lab, certificate number. */
    calibrationNote: text("calibration_note").notNull().default(""),
    retiredAt: timestamp("retired_at", { withTimezone: true }),
    createdById: uuid("created_by_id").references(() => users.id),
    createdAt: createdAt(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex("instruments_lab_asset_idx").on(t.labId, sql`lower(${t.assetTag})`),
    index("instruments_due_idx").on(t.labId, t.calibrationDue),
  ],
);

/** A calibration certificate file of an instrument (bytes in the attachment store under `file_key`). */
export const instrumentCertificates = pgTable(
  "instrument_certificates",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    instrumentId: uuid("instrument_id").notNull().references(() => instruments.id),
    originalName: text("original_name").notNull(),
    contentType: text("content_type").notNull(),
    sizeBytes: bigint("size_bytes", { mode: "number" }).notNull(),
    fileKey: text("file_key").notNull().unique(),
    fileHash: text("file_hash").notNull(),
    uploadedById: uuid("uploaded_by_id").notNull().references(() => users.id),
    createdAt: createdAt(),
  },
  (t) => [index("instrument_certificates_instrument_idx").on(t.instrumentId, t.createdAt)],
);

/** A bench's default instrument set, copied onto each capture it uploads unless the upload says otherwise. */
export const stationInstruments = pgTable(
  "station_instruments",
  {
    stationId: uuid("station_id").notNull().references(() => stations.id),
    instrumentId: uuid("instrument_id").notNull().references(() => instruments.id),
    /** Column header the instrument measured (a probe on one channel), or "" for the whole capture. */
    channel: text("channel").notNull().default(""),
  },
  (t) => [primaryKey({ columns: [t.stationId, t.instrumentId, t.channel] })],
);

/** The instruments that took a capture; kept when an instrument is retired. */
export const captureInstruments = pgTable(
  "capture_instruments",
  {
    captureId: uuid("capture_id").notNull().references(() => captures.id),
    instrumentId: uuid("instrument_id").notNull().references(() => instruments.id),
    channel: text("channel").notNull().default(""),
  },
  (t) => [primaryKey({ columns: [t.captureId, t.instrumentId, t.channel] }), index("capture_instruments_instrument_idx").on(t.instrumentId)],
);

/** A quality engineer's confirmation that a capture taken with an overdue instrument may be reported. */
export const overdueConfirmations = pgTable("overdue_confirmations", {
  captureId: uuid("capture_id").primaryKey().references(() => captures.id),
  reason: text("reason").notNull(),
  confirmedById: uuid("confirmed_by_id").notNull().references(() => users.id),
  signatureId: uuid("signature_id"),
  createdAt: createdAt(),
});

/**
 * One row per judged figure of an analysis, written with the analysis (and again on re-judging), so
 * trends are a SQL query over an index. `figure` is a check or figure id; `harmonic_order` is 0 except
 * for single-harmonic rows.
 */
export const analysisFigures = pgTable(
  "analysis_figures",
  {
    analysisId: uuid("analysis_id").notNull().references(() => analyses.id),
    captureId: uuid("capture_id").notNull().references(() => captures.id),
    unitId: uuid("unit_id").notNull().references(() => units.id),
    ratingId: uuid("rating_id").notNull().references(() => ratings.id),
    labId: uuid("lab_id").notNull().references(() => organisations.id),
    figure: text("figure").notNull(),
    harmonicOrder: integer("harmonic_order").notNull().default(0),
    value: doublePrecision("value"),
    /** Expanded uncertainty (k = 2) in the figure's unit, where evaluated. */
    expandedUncertainty: doublePrecision("expanded_uncertainty"),
    status: verdictStatus("status"),
    /** Clipped, wrongly scaled or otherwise warned: shown apart and left out of statistics. */
    flagged: boolean("flagged").notNull().default(false),
    current: boolean("current").notNull().default(true),
    measuredAt: timestamp("measured_at", { withTimezone: true }).notNull(),
    /** The plan step its analysis was judged for (analyses.plan_step_id), so the record pick reads this table alone. */
    planStepId: uuid("plan_step_id").references(() => planSteps.id),
  },
  (t) => [
    primaryKey({ columns: [t.analysisId, t.figure, t.harmonicOrder] }),
    // Each unit's figure of record is picked from one range of this index, without the table (trends).
    // The columns after measured_at only cover the pick (drizzle has no INCLUDE), so it is an index-only scan.
    index("analysis_figures_record_idx")
      .on(t.ratingId, t.figure, t.harmonicOrder, t.unitId, t.measuredAt, t.labId, t.captureId, t.planStepId, t.value, t.status, t.flagged, t.expandedUncertainty)
      .where(sql`${t.current}`),
    index("analysis_figures_unit_idx").on(t.unitId),
  ],
);

export type Instrument = typeof instruments.$inferSelect;
export type InstrumentKind = (typeof instrumentKind.enumValues)[number];
export type AnalysisFigure = typeof analysisFigures.$inferSelect;
