import { sql } from "drizzle-orm";
import { boolean, index, integer, jsonb, pgEnum, pgTable, bigint, text, timestamp, uniqueIndex, uuid } from "drizzle-orm/pg-core";
import { disposition, organisations, units, users, verdictStatus } from "./core";

// Released test reports, signatures, notes, client tokens and mail (the release data model).

const createdAt = () => timestamp("created_at", { withTimezone: true }).notNull().defaultNow();

/** Why a signature was given; the sentence shown beside it lives in lib (signature meanings). */
export const signaturePurpose = pgEnum("signature_purpose", [
  "release", "supersede", "withdraw", "concession", "scrap", "reopen", "overdue-instrument",
]);

/**
 * A signature: the signer re-entered their password. Name and role are copied at signing time so the
 * record reads the same after the user is renamed, moved or disabled.
 */
export const signatures = pgTable(
  "signatures",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    labId: uuid("lab_id").notNull().references(() => organisations.id),
    signerId: uuid("signer_id").notNull().references(() => users.id),
    signerName: text("signer_name").notNull(),
    signerRole: text("signer_role").notNull(),
    purpose: signaturePurpose("purpose").notNull(),
    /** The meaning as shown to the signer, e.g. "reviewed and approved for release". */
    meaning: text("meaning").notNull(),
    subjectKind: text("subject_kind", { enum: ["unit", "report", "capture"] }).notNull(),
    subjectId: uuid("subject_id").notNull(),
    signedAt: timestamp("signed_at", { withTimezone: true }).notNull().defaultNow(),
  },
  (t) => [index("signatures_subject_idx").on(t.subjectKind, t.subjectId, t.signedAt)],
);

/** Who a note is for: "internal" stays inside the lab; "client" is shown to the unit's client. */
export const noteVisibility = pgEnum("note_visibility", ["internal", "client"]);

export const unitNotes = pgTable(
  "unit_notes",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    unitId: uuid("unit_id").notNull().references(() => units.id),
    authorId: uuid("author_id").notNull().references(() => users.id),
    visibility: noteVisibility("visibility").notNull(),
    body: text("body").notNull(),
    createdAt: createdAt(),
  },
  (t) => [index("unit_notes_unit_idx").on(t.unitId, t.createdAt)],
);

/** A lab's report numbering: `${prefix}${zero-padded sequence}`; the row is locked while a number is taken. */
export const labSettings = pgTable("lab_settings", {
  labId: uuid("lab_id").primaryKey().references(() => organisations.id),
  reportPrefix: text("report_prefix").notNull().default("R-"),
  nextReportNumber: integer("next_report_number").notNull().default(1),
  /** Shown on reports under the lab's name (accreditation, scope), optional. */
  reportFooter: text("report_footer").notNull().default(""),
  updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
});

export const reportStatus = pgEnum("report_status", ["valid", "superseded", "withdrawn"]);

/**
 * One released revision of a unit's test report. The PDF is rendered once at release and stored under
 * `object_key`; downloads serve those bytes. A new revision keeps the number and supersedes this one.
 */
export const reports = pgTable(
  "reports",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    labId: uuid("lab_id").notNull().references(() => organisations.id),
    unitId: uuid("unit_id").notNull().references(() => units.id),
    clientId: uuid("client_id").notNull().references(() => organisations.id),
    number: text("number").notNull(),
    revision: integer("revision").notNull(),
    status: reportStatus("status").notNull().default("valid"),
    objectKey: text("object_key").notNull().unique(),
    sha256: text("sha256").notNull(),
    sizeBytes: bigint("size_bytes", { mode: "number" }).notNull(),
    pageCount: integer("page_count").notNull(),
    disposition: disposition("disposition").notNull(),
    overall: verdictStatus("overall"),
    /** The facts the PDF was drawn from (steps of record, figures, limits, verdicts), for the CSV and API. */
    content: jsonb("content").$type<Record<string, unknown>>().notNull(),
    releasedAt: timestamp("released_at", { withTimezone: true }).notNull().defaultNow(),
    releasedById: uuid("released_by_id").notNull().references(() => users.id),
    signatureId: uuid("signature_id").notNull().references(() => signatures.id),
    /** Why this revision replaces the previous one (required from revision 2). */
    reason: text("reason").notNull().default(""),
    supersededById: uuid("superseded_by_id"),
    withdrawnAt: timestamp("withdrawn_at", { withTimezone: true }),
    withdrawnById: uuid("withdrawn_by_id").references(() => users.id),
    withdrawReason: text("withdraw_reason"),
  },
  (t) => [
    uniqueIndex("reports_number_revision_idx").on(t.number, t.revision),
    index("reports_unit_idx").on(t.unitId, t.revision),
    index("reports_client_idx").on(t.clientId, t.releasedAt),
    index("reports_lab_idx").on(t.labId, t.releasedAt),
  ],
);

/** Personal API tokens of a client's users (made by the client's administrator); only the sha256 is kept. */
export const clientTokens = pgTable(
  "client_tokens",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    organisationId: uuid("organisation_id").notNull().references(() => organisations.id),
    userId: uuid("user_id").notNull().references(() => users.id),
    label: text("label").notNull(),
    prefix: text("prefix").notNull().unique(),
    secretHash: text("secret_hash").notNull(),
    expiresAt: timestamp("expires_at", { withTimezone: true }).notNull(),
    revokedAt: timestamp("revoked_at", { withTimezone: true }),
    lastUsedAt: timestamp("last_used_at", { withTimezone: true }),
    createdAt: createdAt(),
  },
  (t) => [index("client_tokens_org_idx").on(t.organisationId)],
);

/** What a user wants mailed. Absent keys take the defaults in lib (notification preferences). */
export type NotificationPrefs = {
  captureAlerts?: "off" | "hourly" | "daily-digest";
  reportNews?: boolean;
  instrumentsDue?: boolean;
};

export const notificationPrefs = pgTable("notification_prefs", {
  userId: uuid("user_id").primaryKey().references(() => users.id),
  prefs: jsonb("prefs").$type<NotificationPrefs>().notNull().default({}),
  updatedAt: timestamp("updated_at", { withTimezone: true }).notNull().defaultNow(),
});

export const mailStatus = pgEnum("mail_status", ["queued", "sent", "failed"]);

/**
 * Every mail the service means to send. A queue job sends it and retries; `dedupe_key` keeps at most one
 * row per key (e.g. one capture alert per unit per user per hour). Failures are shown to the lab manager.
 */
export const mailOutbox = pgTable(
  "mail_outbox",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    labId: uuid("lab_id").references(() => organisations.id),
    toUserId: uuid("to_user_id").references(() => users.id),
    toAddress: text("to_address").notNull(),
    kind: text("kind").notNull(),
    subject: text("subject").notNull(),
    textBody: text("text_body").notNull(),
    htmlBody: text("html_body").notNull(),
    fromName: text("from_name").notNull(),
    status: mailStatus("status").notNull().default("queued"),
    attempts: integer("attempts").notNull().default(0),
    /** A plain sentence for the lab manager; never a host, port or stack. */
    lastError: text("last_error"),
    dedupeKey: text("dedupe_key"),
    createdAt: createdAt(),
    sentAt: timestamp("sent_at", { withTimezone: true }),
  },
  (t) => [
    uniqueIndex("mail_outbox_dedupe_idx").on(t.dedupeKey).where(sql`${t.dedupeKey} is not null`),
    index("mail_outbox_status_idx").on(t.status, t.createdAt),
    index("mail_outbox_lab_idx").on(t.labId, t.createdAt),
  ],
);

/** Review queue: the quality engineer a unit is assigned to. */
export const unitAssignments = pgTable("unit_assignments", {
  unitId: uuid("unit_id").primaryKey().references(() => units.id),
  assigneeId: uuid("assignee_id").notNull().references(() => users.id),
  assignedById: uuid("assigned_by_id").notNull().references(() => users.id),
  assignedAt: timestamp("assigned_at", { withTimezone: true }).notNull().defaultNow(),
});

/** A client user who manages their organisation's API tokens. */
export const clientAdmins = pgTable("client_admins", {
  userId: uuid("user_id").primaryKey().references(() => users.id),
  grantedById: uuid("granted_by_id").references(() => users.id),
  active: boolean("active").notNull().default(true),
  createdAt: createdAt(),
});

export type Signature = typeof signatures.$inferSelect;
export type UnitNote = typeof unitNotes.$inferSelect;
export type LabSettings = typeof labSettings.$inferSelect;
export type Report = typeof reports.$inferSelect;
export type ReportStatus = (typeof reportStatus.enumValues)[number];
export type ClientToken = typeof clientTokens.$inferSelect;
export type MailOutboxRow = typeof mailOutbox.$inferSelect;
export type SignaturePurpose = (typeof signaturePurpose.enumValues)[number];
