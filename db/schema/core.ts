import { sql } from "drizzle-orm";
import {
  bigint, boolean, doublePrecision, index, integer, jsonb, pgEnum, pgTable, primaryKey, text, timestamp, uniqueIndex, uuid,
} from "drizzle-orm/pg-core";
import type { Rating as RatingNameplate } from "../../lib/analysis/rating";
import type { CheckId, ToleranceProfile } from "../../lib/analysis/tolerance";

// Row types come from here and nowhere else.

export const organisationKind = pgEnum("organisation_kind", ["lab", "manufacturer"]);
export const userRole = pgEnum("user_role", ["admin", "operator", "qa", "manufacturer"]);
export const testKind = pgEnum("test_kind", ["no-load", "load", "back-emf", "other"]);
export const captureState = pgEnum("capture_state", ["uploading", "queued", "analysing", "analysed", "rejected", "failed"]);
// "not-applicable" only in results made before engine 2.0.0; "not-required" never reaches an overall.
export const verdictStatus = pgEnum("verdict_status", ["pass", "marginal", "fail", "not-applicable", "inconclusive", "not-required"]);
/** Where a unit stands against its rating's test plan (lib/analysis evaluatePlan). */
export const planState = pgEnum("plan_state", ["incomplete", "complete-within", "failed", "inconclusive"]);
export const disposition = pgEnum("disposition", ["open", "accepted", "accepted-with-concession", "rework", "scrapped"]);

const createdAt = () => timestamp("created_at", { withTimezone: true }).notNull().defaultNow();

export const organisations = pgTable("organisations", {
  id: uuid("id").primaryKey().defaultRandom(),
  name: text("name").notNull(),
  slug: text("slug").notNull().unique(),
  kind: organisationKind("kind").notNull(),
  address: text("address").notNull().default(""),
  contactEmail: text("contact_email").notNull().default(""),
  /** The client's own reference code for itself (what their purchase orders say). */
  referenceCode: text("reference_code").notNull().default(""),
  deactivatedAt: timestamp("deactivated_at", { withTimezone: true }),
  createdAt: createdAt(),
});

/** Which labs serve which client organisations; every client scope goes through it. */
export const labClients = pgTable(
  "lab_clients",
  {
    labId: uuid("lab_id").notNull().references(() => organisations.id),
    clientId: uuid("client_id").notNull().references(() => organisations.id),
    createdAt: createdAt(),
  },
  (t) => [primaryKey({ columns: [t.labId, t.clientId] }), index("lab_clients_client_idx").on(t.clientId)],
);

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
    /** Bumped to end every session of the user (password change, disable, role change, sign out everywhere). */
    sessionVersion: integer("session_version").notNull().default(0),
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

/**
 * A machine model's nameplate rating, defined by a lab for one of its clients (whose units carry it).
 * Retired, never deleted, once units reference it.
 */
export const ratings = pgTable(
  "ratings",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    /** The client whose model this is. */
    organisationId: uuid("organisation_id").notNull().references(() => organisations.id),
    /** The lab that defined it and judges against it. */
    labId: uuid("lab_id").notNull().references(() => organisations.id),
    modelCode: text("model_code").notNull(),
    title: text("title").notNull(),
    nameplate: jsonb("nameplate").$type<RatingNameplate>().notNull(),
    retiredAt: timestamp("retired_at", { withTimezone: true }),
    createdAt: createdAt(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex("ratings_lab_org_model_idx").on(t.labId, t.organisationId, t.modelCode)],
);

/** Immutable versions of a rating's tolerance profile; the highest version is in force. */
export const toleranceProfiles = pgTable(
  "tolerance_profiles",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    ratingId: uuid("rating_id").notNull().references(() => ratings.id),
    version: integer("version").notNull(),
    profile: jsonb("profile").$type<ToleranceProfile>().notNull(),
    reason: text("reason").notNull(),
    createdById: uuid("created_by_id").references(() => users.id),
    createdAt: createdAt(),
  },
  (t) => [uniqueIndex("tolerance_profiles_rating_version_idx").on(t.ratingId, t.version)],
);

/** The steps of a rating's test plan; a unit is complete when each has a capture of record within tolerance. */
export const planSteps = pgTable(
  "plan_steps",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    ratingId: uuid("rating_id").notNull().references(() => ratings.id),
    position: integer("position").notNull(),
    name: text("name").notNull(),
    testKind: testKind("test_kind").notNull(),
    speedMinRpm: doublePrecision("speed_min_rpm").notNull(),
    speedMaxRpm: doublePrecision("speed_max_rpm").notNull(),
    requiredRoles: jsonb("required_roles").$type<string[]>().notNull().default([]),
    checks: jsonb("checks").$type<CheckId[]>().notNull(),
    retiredAt: timestamp("retired_at", { withTimezone: true }),
    createdAt: createdAt(),
  },
  (t) => [index("plan_steps_rating_idx").on(t.ratingId, t.position)],
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
    /** Against the rating's test plan, refreshed whenever a result, a record or the plan changes. */
    planState: planState("plan_state").notNull().default("incomplete"),
    /**
     * Each active step's status and record, stored with plan_state (the same refresh), so lists of many
     * units read it instead of evaluating every plan. Null until the first refresh after it was added.
     */
    planStanding: jsonb("plan_standing").$type<StoredStepStanding[]>(),
    retiredAt: timestamp("retired_at", { withTimezone: true }),
    createdById: uuid("created_by_id").references(() => users.id),
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
    /** The plan step the capture counts for (matched from test kind and speed, or chosen). */
    planStepId: uuid("plan_step_id").references(() => planSteps.id),
    channelRoles: jsonb("channel_roles").$type<Record<string, string>>().notNull().default({}),
    probeScales: jsonb("probe_scales").$type<Record<string, number>>().notNull().default({}),
    /** Added after scaling, in volts or amps, per column header. */
    channelOffsets: jsonb("channel_offsets").$type<Record<string, number>>().notNull().default({}),
    /** Sample rate given by the operator (or the bench's import profile) for files without a time column, Hz. */
    sampleRateHz: doublePrecision("sample_rate_hz"),
    /** Magnet temperature during a back-EMF test, °C, for Ke at the rating's reference temperature. */
    magnetTemperatureC: doublePrecision("magnet_temperature_c"),
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
    // A client's captures list, newest first, across the units it owns (no lab column to narrow on).
    index("captures_created_idx").on(t.createdAt),
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
    /** The profile version the verdicts were judged against (null for results before versioned profiles). */
    profileVersionId: uuid("profile_version_id").references(() => toleranceProfiles.id),
    planStepId: uuid("plan_step_id").references(() => planSteps.id),
    /** "analysis" read the file; "rejudge" judged the stored figures again. */
    kind: text("kind", { enum: ["analysis", "rejudge"] }).notNull().default("analysis"),
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
    /** The client's concession reference, for "accepted with concession". */
    concessionRef: text("concession_ref"),
    /** The signature (db/schema/release.ts signatures) given for this decision, where one was asked. */
    signatureId: uuid("signature_id"),
    /** What changed, for edits and record choices: { field: [before, after] } or ids. */
    detail: jsonb("detail").$type<Record<string, unknown>>(),
    createdAt: createdAt(),
  },
  (t) => [index("unit_events_unit_idx").on(t.unitId, t.createdAt)],
);

/** Corrections of a capture's settings after upload; each queues a new analysis. */
export const captureCorrections = pgTable(
  "capture_corrections",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    captureId: uuid("capture_id").notNull().references(() => captures.id),
    actorId: uuid("actor_id").references(() => users.id),
    stationKeyId: uuid("station_key_id").references(() => stationKeys.id),
    reason: text("reason").notNull(),
    before: jsonb("before").$type<Record<string, unknown>>().notNull(),
    after: jsonb("after").$type<Record<string, unknown>>().notNull(),
    createdAt: createdAt(),
  },
  (t) => [index("capture_corrections_capture_idx").on(t.captureId, t.createdAt)],
);

/** A quality engineer's choice of the capture of record for a unit's plan step (else the latest valid one). */
export const stepRecords = pgTable(
  "step_records",
  {
    unitId: uuid("unit_id").notNull().references(() => units.id),
    planStepId: uuid("plan_step_id").notNull().references(() => planSteps.id),
    captureId: uuid("capture_id").notNull().references(() => captures.id),
    reason: text("reason").notNull(),
    chosenById: uuid("chosen_by_id").notNull().references(() => users.id),
    createdAt: createdAt(),
  },
  (t) => [primaryKey({ columns: [t.unitId, t.planStepId] })],
);

/** A bench's remembered import settings for one header layout (roles, probe ratios, offsets, time base). */
export const importProfiles = pgTable(
  "import_profiles",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    stationId: uuid("station_id").notNull().references(() => stations.id),
    headerSignature: text("header_signature").notNull(),
    headerPreview: text("header_preview").notNull(),
    settings: jsonb("settings").$type<Record<string, unknown>>().notNull(),
    updatedById: uuid("updated_by_id").references(() => users.id),
    createdAt: createdAt(),
    updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [uniqueIndex("import_profiles_station_header_idx").on(t.stationId, t.headerSignature)],
);

/**
 * One row per sign-in (its id travels in the session token). Sign-out and "end my other sessions" set
 * ended_at; every request checks the row and the user's session_version.
 */
export const userSessions = pgTable(
  "user_sessions",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    userId: uuid("user_id").notNull().references(() => users.id),
    createdAt: createdAt(),
    expiresAt: timestamp("expires_at", { withTimezone: true }).notNull(),
    endedAt: timestamp("ended_at", { withTimezone: true }),
  },
  (t) => [index("user_sessions_user_idx").on(t.userId)],
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
export type ToleranceProfileVersion = typeof toleranceProfiles.$inferSelect;
export type PlanStepRow = typeof planSteps.$inferSelect;
export type CaptureCorrection = typeof captureCorrections.$inferSelect;
export type ImportProfile = typeof importProfiles.$inferSelect;
export type PlanState = (typeof planState.enumValues)[number];
/** One step of units.plan_standing. */
export type StoredStepStanding = { stepId: string; status: "passed" | "failed" | "inconclusive" | "missing"; recordCaptureId: string | null; chosen: boolean };
export type VerdictStatusValue = (typeof verdictStatus.enumValues)[number];

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
