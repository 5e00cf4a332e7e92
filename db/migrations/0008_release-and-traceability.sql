CREATE TYPE "public"."mail_status" AS ENUM('queued', 'sent', 'failed');--> statement-breakpoint
CREATE TYPE "public"."note_visibility" AS ENUM('internal', 'client');--> statement-breakpoint
CREATE TYPE "public"."report_status" AS ENUM('valid', 'superseded', 'withdrawn');--> statement-breakpoint
CREATE TYPE "public"."signature_purpose" AS ENUM('release', 'supersede', 'withdraw', 'concession', 'scrap', 'reopen', 'overdue-instrument');--> statement-breakpoint
CREATE TYPE "public"."instrument_kind" AS ENUM('oscilloscope', 'voltage-probe', 'current-probe', 'daq', 'tachometer');--> statement-breakpoint
CREATE TABLE "client_admins" (
	"user_id" uuid PRIMARY KEY NOT NULL,
	"granted_by_id" uuid,
	"active" boolean DEFAULT true NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "client_tokens" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"user_id" uuid NOT NULL,
	"label" text NOT NULL,
	"prefix" text NOT NULL,
	"secret_hash" text NOT NULL,
	"expires_at" timestamp with time zone NOT NULL,
	"revoked_at" timestamp with time zone,
	"last_used_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "client_tokens_prefix_unique" UNIQUE("prefix")
);
--> statement-breakpoint
CREATE TABLE "lab_settings" (
	"lab_id" uuid PRIMARY KEY NOT NULL,
	"report_prefix" text DEFAULT 'R-' NOT NULL,
	"next_report_number" integer DEFAULT 1 NOT NULL,
	"report_footer" text DEFAULT '' NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "mail_outbox" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"lab_id" uuid,
	"to_user_id" uuid,
	"to_address" text NOT NULL,
	"kind" text NOT NULL,
	"subject" text NOT NULL,
	"text_body" text NOT NULL,
	"html_body" text NOT NULL,
	"from_name" text NOT NULL,
	"status" "mail_status" DEFAULT 'queued' NOT NULL,
	"attempts" integer DEFAULT 0 NOT NULL,
	"last_error" text,
	"dedupe_key" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"sent_at" timestamp with time zone
);
--> statement-breakpoint
CREATE TABLE "notification_prefs" (
	"user_id" uuid PRIMARY KEY NOT NULL,
	"prefs" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "reports" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"lab_id" uuid NOT NULL,
	"unit_id" uuid NOT NULL,
	"client_id" uuid NOT NULL,
	"number" text NOT NULL,
	"revision" integer NOT NULL,
	"status" "report_status" DEFAULT 'valid' NOT NULL,
	"object_key" text NOT NULL,
	"sha256" text NOT NULL,
	"size_bytes" bigint NOT NULL,
	"page_count" integer NOT NULL,
	"disposition" "disposition" NOT NULL,
	"overall" "verdict_status",
	"content" jsonb NOT NULL,
	"released_at" timestamp with time zone DEFAULT now() NOT NULL,
	"released_by_id" uuid NOT NULL,
	"signature_id" uuid NOT NULL,
	"reason" text DEFAULT '' NOT NULL,
	"superseded_by_id" uuid,
	"withdrawn_at" timestamp with time zone,
	"withdrawn_by_id" uuid,
	"withdraw_reason" text,
	CONSTRAINT "reports_object_key_unique" UNIQUE("object_key")
);
--> statement-breakpoint
CREATE TABLE "signatures" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"lab_id" uuid NOT NULL,
	"signer_id" uuid NOT NULL,
	"signer_name" text NOT NULL,
	"signer_role" text NOT NULL,
	"purpose" "signature_purpose" NOT NULL,
	"meaning" text NOT NULL,
	"subject_kind" text NOT NULL,
	"subject_id" uuid NOT NULL,
	"signed_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "unit_assignments" (
	"unit_id" uuid PRIMARY KEY NOT NULL,
	"assignee_id" uuid NOT NULL,
	"assigned_by_id" uuid NOT NULL,
	"assigned_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "unit_notes" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"unit_id" uuid NOT NULL,
	"author_id" uuid NOT NULL,
	"visibility" "note_visibility" NOT NULL,
	"body" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "analysis_figures" (
	"analysis_id" uuid NOT NULL,
	"capture_id" uuid NOT NULL,
	"unit_id" uuid NOT NULL,
	"rating_id" uuid NOT NULL,
	"lab_id" uuid NOT NULL,
	"figure" text NOT NULL,
	"harmonic_order" integer DEFAULT 0 NOT NULL,
	"value" double precision,
	"expanded_uncertainty" double precision,
	"status" "verdict_status",
	"flagged" boolean DEFAULT false NOT NULL,
	"current" boolean DEFAULT true NOT NULL,
	"measured_at" timestamp with time zone NOT NULL,
	CONSTRAINT "analysis_figures_analysis_id_figure_harmonic_order_pk" PRIMARY KEY("analysis_id","figure","harmonic_order")
);
--> statement-breakpoint
CREATE TABLE "capture_instruments" (
	"capture_id" uuid NOT NULL,
	"instrument_id" uuid NOT NULL,
	"channel" text DEFAULT '' NOT NULL,
	CONSTRAINT "capture_instruments_capture_id_instrument_id_channel_pk" PRIMARY KEY("capture_id","instrument_id","channel")
);
--> statement-breakpoint
CREATE TABLE "instrument_certificates" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"instrument_id" uuid NOT NULL,
	"original_name" text NOT NULL,
	"content_type" text NOT NULL,
	"size_bytes" bigint NOT NULL,
	"file_key" text NOT NULL,
	"file_hash" text NOT NULL,
	"uploaded_by_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "instrument_certificates_file_key_unique" UNIQUE("file_key")
);
--> statement-breakpoint
CREATE TABLE "instruments" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"lab_id" uuid NOT NULL,
	"kind" "instrument_kind" NOT NULL,
	"make" text NOT NULL,
	"model" text NOT NULL,
	"serial" text NOT NULL,
	"asset_tag" text NOT NULL,
	"spec" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"calibrated_on" date,
	"calibration_due" date,
	"calibration_note" text DEFAULT '' NOT NULL,
	"retired_at" timestamp with time zone,
	"created_by_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "overdue_confirmations" (
	"capture_id" uuid PRIMARY KEY NOT NULL,
	"reason" text NOT NULL,
	"confirmed_by_id" uuid NOT NULL,
	"signature_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "station_instruments" (
	"station_id" uuid NOT NULL,
	"instrument_id" uuid NOT NULL,
	"channel" text DEFAULT '' NOT NULL,
	CONSTRAINT "station_instruments_station_id_instrument_id_channel_pk" PRIMARY KEY("station_id","instrument_id","channel")
);
--> statement-breakpoint
ALTER TABLE "unit_events" ADD COLUMN "concession_ref" text;--> statement-breakpoint
ALTER TABLE "unit_events" ADD COLUMN "signature_id" uuid;--> statement-breakpoint
ALTER TABLE "client_admins" ADD CONSTRAINT "client_admins_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "client_admins" ADD CONSTRAINT "client_admins_granted_by_id_users_id_fk" FOREIGN KEY ("granted_by_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "client_tokens" ADD CONSTRAINT "client_tokens_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "client_tokens" ADD CONSTRAINT "client_tokens_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lab_settings" ADD CONSTRAINT "lab_settings_lab_id_organisations_id_fk" FOREIGN KEY ("lab_id") REFERENCES "public"."organisations"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "mail_outbox" ADD CONSTRAINT "mail_outbox_lab_id_organisations_id_fk" FOREIGN KEY ("lab_id") REFERENCES "public"."organisations"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "mail_outbox" ADD CONSTRAINT "mail_outbox_to_user_id_users_id_fk" FOREIGN KEY ("to_user_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "notification_prefs" ADD CONSTRAINT "notification_prefs_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reports" ADD CONSTRAINT "reports_lab_id_organisations_id_fk" FOREIGN KEY ("lab_id") REFERENCES "public"."organisations"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reports" ADD CONSTRAINT "reports_unit_id_units_id_fk" FOREIGN KEY ("unit_id") REFERENCES "public"."units"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reports" ADD CONSTRAINT "reports_client_id_organisations_id_fk" FOREIGN KEY ("client_id") REFERENCES "public"."organisations"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reports" ADD CONSTRAINT "reports_released_by_id_users_id_fk" FOREIGN KEY ("released_by_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reports" ADD CONSTRAINT "reports_signature_id_signatures_id_fk" FOREIGN KEY ("signature_id") REFERENCES "public"."signatures"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reports" ADD CONSTRAINT "reports_withdrawn_by_id_users_id_fk" FOREIGN KEY ("withdrawn_by_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "signatures" ADD CONSTRAINT "signatures_lab_id_organisations_id_fk" FOREIGN KEY ("lab_id") REFERENCES "public"."organisations"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "signatures" ADD CONSTRAINT "signatures_signer_id_users_id_fk" FOREIGN KEY ("signer_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "unit_assignments" ADD CONSTRAINT "unit_assignments_unit_id_units_id_fk" FOREIGN KEY ("unit_id") REFERENCES "public"."units"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "unit_assignments" ADD CONSTRAINT "unit_assignments_assignee_id_users_id_fk" FOREIGN KEY ("assignee_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "unit_assignments" ADD CONSTRAINT "unit_assignments_assigned_by_id_users_id_fk" FOREIGN KEY ("assigned_by_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "unit_notes" ADD CONSTRAINT "unit_notes_unit_id_units_id_fk" FOREIGN KEY ("unit_id") REFERENCES "public"."units"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "unit_notes" ADD CONSTRAINT "unit_notes_author_id_users_id_fk" FOREIGN KEY ("author_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "analysis_figures" ADD CONSTRAINT "analysis_figures_analysis_id_analyses_id_fk" FOREIGN KEY ("analysis_id") REFERENCES "public"."analyses"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "analysis_figures" ADD CONSTRAINT "analysis_figures_capture_id_captures_id_fk" FOREIGN KEY ("capture_id") REFERENCES "public"."captures"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "analysis_figures" ADD CONSTRAINT "analysis_figures_unit_id_units_id_fk" FOREIGN KEY ("unit_id") REFERENCES "public"."units"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "analysis_figures" ADD CONSTRAINT "analysis_figures_rating_id_ratings_id_fk" FOREIGN KEY ("rating_id") REFERENCES "public"."ratings"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "analysis_figures" ADD CONSTRAINT "analysis_figures_lab_id_organisations_id_fk" FOREIGN KEY ("lab_id") REFERENCES "public"."organisations"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "capture_instruments" ADD CONSTRAINT "capture_instruments_capture_id_captures_id_fk" FOREIGN KEY ("capture_id") REFERENCES "public"."captures"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "capture_instruments" ADD CONSTRAINT "capture_instruments_instrument_id_instruments_id_fk" FOREIGN KEY ("instrument_id") REFERENCES "public"."instruments"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "instrument_certificates" ADD CONSTRAINT "instrument_certificates_instrument_id_instruments_id_fk" FOREIGN KEY ("instrument_id") REFERENCES "public"."instruments"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "instrument_certificates" ADD CONSTRAINT "instrument_certificates_uploaded_by_id_users_id_fk" FOREIGN KEY ("uploaded_by_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "instruments" ADD CONSTRAINT "instruments_lab_id_organisations_id_fk" FOREIGN KEY ("lab_id") REFERENCES "public"."organisations"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "instruments" ADD CONSTRAINT "instruments_created_by_id_users_id_fk" FOREIGN KEY ("created_by_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "overdue_confirmations" ADD CONSTRAINT "overdue_confirmations_capture_id_captures_id_fk" FOREIGN KEY ("capture_id") REFERENCES "public"."captures"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "overdue_confirmations" ADD CONSTRAINT "overdue_confirmations_confirmed_by_id_users_id_fk" FOREIGN KEY ("confirmed_by_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "station_instruments" ADD CONSTRAINT "station_instruments_station_id_stations_id_fk" FOREIGN KEY ("station_id") REFERENCES "public"."stations"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "station_instruments" ADD CONSTRAINT "station_instruments_instrument_id_instruments_id_fk" FOREIGN KEY ("instrument_id") REFERENCES "public"."instruments"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "client_tokens_org_idx" ON "client_tokens" USING btree ("organisation_id");--> statement-breakpoint
CREATE UNIQUE INDEX "mail_outbox_dedupe_idx" ON "mail_outbox" USING btree ("dedupe_key") WHERE "mail_outbox"."dedupe_key" is not null;--> statement-breakpoint
CREATE INDEX "mail_outbox_status_idx" ON "mail_outbox" USING btree ("status","created_at");--> statement-breakpoint
CREATE INDEX "mail_outbox_lab_idx" ON "mail_outbox" USING btree ("lab_id","created_at");--> statement-breakpoint
CREATE UNIQUE INDEX "reports_number_revision_idx" ON "reports" USING btree ("number","revision");--> statement-breakpoint
CREATE INDEX "reports_unit_idx" ON "reports" USING btree ("unit_id","revision");--> statement-breakpoint
CREATE INDEX "reports_client_idx" ON "reports" USING btree ("client_id","released_at");--> statement-breakpoint
CREATE INDEX "reports_lab_idx" ON "reports" USING btree ("lab_id","released_at");--> statement-breakpoint
CREATE INDEX "signatures_subject_idx" ON "signatures" USING btree ("subject_kind","subject_id","signed_at");--> statement-breakpoint
CREATE INDEX "unit_notes_unit_idx" ON "unit_notes" USING btree ("unit_id","created_at");--> statement-breakpoint
CREATE INDEX "analysis_figures_trend_idx" ON "analysis_figures" USING btree ("rating_id","figure","harmonic_order","measured_at") WHERE "analysis_figures"."current";--> statement-breakpoint
CREATE INDEX "analysis_figures_unit_idx" ON "analysis_figures" USING btree ("unit_id");--> statement-breakpoint
CREATE INDEX "capture_instruments_instrument_idx" ON "capture_instruments" USING btree ("instrument_id");--> statement-breakpoint
CREATE INDEX "instrument_certificates_instrument_idx" ON "instrument_certificates" USING btree ("instrument_id","created_at");--> statement-breakpoint
CREATE UNIQUE INDEX "instruments_lab_asset_idx" ON "instruments" USING btree ("lab_id",lower("asset_tag"));--> statement-breakpoint
CREATE INDEX "instruments_due_idx" ON "instruments" USING btree ("lab_id","calibration_due");