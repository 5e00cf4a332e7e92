import { sql } from "drizzle-orm";
import {
  bigint, boolean, doublePrecision, index, integer, jsonb, pgEnum, pgTable, text, timestamp, uniqueIndex, uuid,
} from "drizzle-orm/pg-core";

// Row types come from here and nowhere else.

export const organisationKind = pgEnum("organisation_kind", ["lab", "manufacturer"]);
export const userRole = pgEnum("user_role", ["admin", "operator", "qa", "manufacturer"]);
export const testKind = pgEnum("test_kind", ["no-load", "load", "back-emf", "other"]);
export const captureState = pgEnum("capture_state", ["uploading", "queued", "analysing", "analysed", "rejected", "failed"]);
export const verdictStatus = pgEnum("verdict_status", ["pass", "marginal", "fail", "not-applicable"]);
export const disposition = pgEnum("disposition", ["open", "accepted", "accepted-with-concession", "rework", "scrapped"]);

const createdAt = () => timestamp("created_at", { withTimezone: true }).notNull().defaultNow();

export const organisations = pgTable("organisations", {
  id: uuid("id").primaryKey().defaultRandom(),
  name: text("name").notNull(),
  slug: text("slug").notNull().unique(),
  kind: organisationKind("kind").notNull(),
  createdAt: createdAt(),
});

export const users = pgTable(
  "users",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    email: text("email").notNull(),
    name: text("name").notNull(),
    passwordHash: text("password_hash").notNull(),
    role: userRole("role").notNull(),
    organisationId: uuid("organisation_id").notNull().references(() => organisations.id),
    disabledAt: timestamp("disabled_at", { withTimezone: true }),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("users_email_lower_idx").on(sql`lower(${t.email})`), index("users_org_idx").on(t.organisationId)],
);

/** Failed sign-in attempts, for rate limiting per account and per client address. */
export const signInAttempts = pgTable(
  "sign_in_attempts",
  {
    id: bigint("id", { mode: "number" }).primaryKey().generatedAlwaysAsIdentity(),
    email: text("email").notNull(),
    address: text("address").notNull(),
    at: timestamp("at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("sign_in_attempts_email_idx").on(t.email, t.at), index("sign_in_attempts_address_idx").on(t.address, t.at)],
);

/** A machine model's nameplate rating, owned by the manufacturer whose units carry it. */
export const ratings = pgTable(
  "ratings",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    organisationId: uuid("organisation_id").notNull().references(() => organisations.id),
    modelCode: text("model_code").notNull(),
    title: text("title").notNull(),
    // Validated with ratingSchema from lib/analysis.
    nameplate: jsonb("nameplate").notNull(),
    // A tolerance profile (a preset copy, possibly edited), validated with toleranceProfileSchema.
    tolerance: jsonb("tolerance").notNull(),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("ratings_org_model_idx").on(t.organisationId, t.modelCode)],
);

export const units = pgTable(
  "units",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    serial: text("serial").notNull(),
    ratingId: uuid("rating_id").notNull().references(() => ratings.id),
    // Manufacturer that owns the unit; its users may read it.
    organisationId: uuid("organisation_id").notNull().references(() => organisations.id),
    // Lab that tests it; its staff may read and write it.
    labId: uuid("lab_id").notNull().references(() => organisations.id),
    disposition: disposition("disposition").notNull().default("open"),
    latestOverall: verdictStatus("latest_overall"),
    latestCaptureAt: timestamp("latest_capture_at", { withTimezone: true }),
    createdAt: createdAt(),
  },
  (t) => [
    uniqueIndex("units_lab_serial_idx").on(t.labId, t.serial),
    index("units_org_idx").on(t.organisationId, t.serial),
    index("units_overall_idx").on(t.labId, t.latestOverall),
  ],
);

export const stations = pgTable("stations", {
  id: uuid("id").primaryKey().defaultRandom(),
  labId: uuid("lab_id").notNull().references(() => organisations.id),
  name: text("name").notNull(),
  location: text("location").notNull().default(""),
  createdAt: createdAt(),
});

export const stationKeys = pgTable(
  "station_keys",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    stationId: uuid("station_id").notNull().references(() => stations.id),
    prefix: text("prefix").notNull().unique(),
    // sha256 of the secret; the secret itself is shown once and never stored.
    secretHash: text("secret_hash").notNull(),
    label: text("label").notNull(),
    createdById: uuid("created_by_id").notNull().references(() => users.id),
    revokedAt: timestamp("revoked_at", { withTimezone: true }),
    lastUsedAt: timestamp("last_used_at", { withTimezone: true }),
    createdAt: createdAt(),
  },
);

export const captures = pgTable(
  "captures",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    unitId: uuid("unit_id").notNull().references(() => units.id),
    labId: uuid("lab_id").notNull().references(() => organisations.id),
    stationId: uuid("station_id").references(() => stations.id),
    uploadedById: uuid("uploaded_by_id").references(() => users.id),
    stationKeyId: uuid("station_key_id").references(() => stationKeys.id),
    testKind: testKind("test_kind").notNull(),
    speedRpm: doublePrecision("speed_rpm"),
    channelRoles: jsonb("channel_roles").notNull().default({}),
    probeScales: jsonb("probe_scales").notNull().default({}),
    notes: text("notes").notNull().default(""),
    originalName: text("original_name").notNull(),
    objectKey: text("object_key").notNull().unique(),
    sizeBytes: bigint("size_bytes", { mode: "number" }).notNull(),
    sha256: text("sha256").notNull(),
    multipartUploadId: text("multipart_upload_id"),
    // ETag of the stored object when the upload was completed; the worker reads with If-Match on it.
    objectEtag: text("object_etag"),
    state: captureState("state").notNull().default("uploading"),
    stateMessage: text("state_message"),
    progress: integer("progress").notNull().default(0),
    attempts: integer("attempts").notNull().default(0),
    uploadedAt: timestamp("uploaded_at", { withTimezone: true }),
    analysedAt: timestamp("analysed_at", { withTimezone: true }),
    createdAt: createdAt(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex("captures_unit_sha_idx").on(t.unitId, t.sha256),
    index("captures_lab_created_idx").on(t.labId, t.createdAt),
    index("captures_state_idx").on(t.state, t.updatedAt),
    index("captures_unit_idx").on(t.unitId, t.createdAt),
  ],
);

/** Every analysis run is kept; `current` marks the one pages show. */
export const analyses = pgTable(
  "analyses",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    captureId: uuid("capture_id").notNull().references(() => captures.id),
    analysisVersion: text("analysis_version").notNull(),
    toleranceDigest: text("tolerance_digest").notNull(),
    current: boolean("current").notNull().default(true),
    report: jsonb("report").notNull(),
    overall: verdictStatus("overall"),
    frequencyHz: doublePrecision("frequency_hz"),
    worstThdPercent: doublePrecision("worst_thd_percent"),
    vufPercent: doublePrecision("vuf_percent"),
    keLineRmsPerKrpm: doublePrecision("ke_line_rms_per_krpm"),
    // Min/max envelope per channel (computeWaveformEnvelope), a few thousand points at most.
    preview: jsonb("preview"),
    // Harmonic magnitudes per channel: { channels: [{ id, orders[], rms[] }] }.
    spectrum: jsonb("spectrum"),
    createdAt: createdAt(),
  },
  (t) => [
    index("analyses_capture_idx").on(t.captureId, t.createdAt),
    uniqueIndex("analyses_capture_current_idx").on(t.captureId).where(sql`${t.current}`),
    // The captures list sorts current results worst first on these figures.
    index("analyses_current_thd_idx").on(t.worstThdPercent.desc().nullsLast()).where(sql`${t.current}`),
    index("analyses_current_vuf_idx").on(t.vufPercent.desc().nullsLast()).where(sql`${t.current}`),
    index("analyses_current_ke_idx").on(t.keLineRmsPerKrpm.desc().nullsLast()).where(sql`${t.current}`),
    index("analyses_current_frequency_idx").on(t.frequencyHz.desc().nullsLast()).where(sql`${t.current}`),
  ],
);

/** Audit trail of QA dispositions and other decisions on a unit. */
export const unitEvents = pgTable(
  "unit_events",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    unitId: uuid("unit_id").notNull().references(() => units.id),
    actorId: uuid("actor_id").notNull().references(() => users.id),
    kind: text("kind").notNull(),
    fromDisposition: disposition("from_disposition"),
    toDisposition: disposition("to_disposition"),
    comment: text("comment").notNull().default(""),
    createdAt: createdAt(),
  },
  (t) => [index("unit_events_unit_idx").on(t.unitId, t.createdAt)],
);

export type Organisation = typeof organisations.$inferSelect;
export type User = typeof users.$inferSelect;
export type Role = (typeof userRole.enumValues)[number];
export type Rating = typeof ratings.$inferSelect;
export type Unit = typeof units.$inferSelect;
export type Station = typeof stations.$inferSelect;
export type StationKey = typeof stationKeys.$inferSelect;
export type Capture = typeof captures.$inferSelect;
export type CaptureState = (typeof captureState.enumValues)[number];
export type Analysis = typeof analyses.$inferSelect;
export type UnitEvent = typeof unitEvents.$inferSelect;

/** One-time links for invitations and password resets; only the sha256 of the token is stored. */
export const passwordTokens = pgTable(
  "password_tokens",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    userId: uuid("user_id").notNull().references(() => users.id),
    purpose: text("purpose", { enum: ["invite", "reset"] }).notNull(),
    tokenHash: text("token_hash").notNull().unique(),
    expiresAt: timestamp("expires_at", { withTimezone: true }).notNull(),
    usedAt: timestamp("used_at", { withTimezone: true }),
    createdAt: createdAt(),
  },
  (t) => [index("password_tokens_user_idx").on(t.userId)],
);

export type PasswordToken = typeof passwordTokens.$inferSelect;

export const attachmentKind = pgEnum("attachment_kind", ["nameplate", "set-up", "scope-screen", "certificate", "other"]);

/**
 * A file lab staff attached to a unit (photo, scope screenshot, certificate, signed sheet). The bytes
 * live in the uploadthing store under `fileKey`; this row is written by the upload route's
 * onUploadComplete and is what every read checks scope against.
 */
export const attachments = pgTable(
  "attachments",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    unitId: uuid("unit_id").notNull().references(() => units.id),
    kind: attachmentKind("kind").notNull(),
    caption: text("caption").notNull().default(""),
    originalName: text("original_name").notNull(),
    contentType: text("content_type").notNull(),
    sizeBytes: bigint("size_bytes", { mode: "number" }).notNull(),
    fileKey: text("file_key").notNull().unique(),
    // md5 of the bytes as the store reports it.
    fileHash: text("file_hash").notNull(),
    uploadedById: uuid("uploaded_by_id").notNull().references(() => users.id),
    createdAt: createdAt(),
  },
  (t) => [index("attachments_unit_idx").on(t.unitId, t.createdAt)],
);

export type Attachment = typeof attachments.$inferSelect;
export type AttachmentKind = (typeof attachmentKind.enumValues)[number];
