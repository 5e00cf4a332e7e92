CREATE TYPE "public"."capture_state" AS ENUM('uploading', 'queued', 'analysing', 'analysed', 'rejected', 'failed');--> statement-breakpoint
CREATE TYPE "public"."disposition" AS ENUM('open', 'accepted', 'accepted-with-concession', 'rework', 'scrapped');--> statement-breakpoint
CREATE TYPE "public"."organisation_kind" AS ENUM('lab', 'manufacturer');--> statement-breakpoint
CREATE TYPE "public"."test_kind" AS ENUM('no-load', 'load', 'back-emf', 'other');--> statement-breakpoint
CREATE TYPE "public"."user_role" AS ENUM('admin', 'operator', 'qa', 'manufacturer');--> statement-breakpoint
CREATE TYPE "public"."verdict_status" AS ENUM('pass', 'marginal', 'fail', 'not-applicable');--> statement-breakpoint
CREATE TABLE "analyses" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"capture_id" uuid NOT NULL,
	"analysis_version" text NOT NULL,
	"tolerance_digest" text NOT NULL,
	"current" boolean DEFAULT true NOT NULL,
	"report" jsonb NOT NULL,
	"overall" "verdict_status",
	"frequency_hz" double precision,
	"worst_thd_percent" double precision,
	"vuf_percent" double precision,
	"ke_line_rms_per_krpm" double precision,
	"preview" jsonb,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "captures" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"unit_id" uuid NOT NULL,
	"lab_id" uuid NOT NULL,
	"station_id" uuid,
	"uploaded_by_id" uuid,
	"station_key_id" uuid,
	"test_kind" "test_kind" NOT NULL,
	"speed_rpm" double precision,
	"channel_roles" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"probe_scales" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"notes" text DEFAULT '' NOT NULL,
	"original_name" text NOT NULL,
	"object_key" text NOT NULL,
	"size_bytes" bigint NOT NULL,
	"sha256" text NOT NULL,
	"multipart_upload_id" text,
	"state" "capture_state" DEFAULT 'uploading' NOT NULL,
	"state_message" text,
	"progress" integer DEFAULT 0 NOT NULL,
	"attempts" integer DEFAULT 0 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "captures_object_key_unique" UNIQUE("object_key")
);
--> statement-breakpoint
CREATE TABLE "organisations" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"name" text NOT NULL,
	"slug" text NOT NULL,
	"kind" "organisation_kind" NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "organisations_slug_unique" UNIQUE("slug")
);
--> statement-breakpoint
CREATE TABLE "ratings" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"model_code" text NOT NULL,
	"title" text NOT NULL,
	"nameplate" jsonb NOT NULL,
	"tolerance" jsonb NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "sign_in_attempts" (
	"id" bigint PRIMARY KEY GENERATED ALWAYS AS IDENTITY (sequence name "sign_in_attempts_id_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 9223372036854775807 START WITH 1 CACHE 1),
	"email" text NOT NULL,
	"address" text NOT NULL,
	"at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "station_keys" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"station_id" uuid NOT NULL,
	"prefix" text NOT NULL,
	"secret_hash" text NOT NULL,
	"label" text NOT NULL,
	"created_by_id" uuid NOT NULL,
	"revoked_at" timestamp with time zone,
	"last_used_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "station_keys_prefix_unique" UNIQUE("prefix")
);
--> statement-breakpoint
CREATE TABLE "stations" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"lab_id" uuid NOT NULL,
	"name" text NOT NULL,
	"location" text DEFAULT '' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "unit_events" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"unit_id" uuid NOT NULL,
	"actor_id" uuid NOT NULL,
	"kind" text NOT NULL,
	"from_disposition" "disposition",
	"to_disposition" "disposition",
	"comment" text DEFAULT '' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "units" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"serial" text NOT NULL,
	"rating_id" uuid NOT NULL,
	"organisation_id" uuid NOT NULL,
	"lab_id" uuid NOT NULL,
	"disposition" "disposition" DEFAULT 'open' NOT NULL,
	"latest_overall" "verdict_status",
	"latest_capture_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "users" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"email" text NOT NULL,
	"name" text NOT NULL,
	"password_hash" text NOT NULL,
	"role" "user_role" NOT NULL,
	"organisation_id" uuid NOT NULL,
	"disabled_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "analyses" ADD CONSTRAINT "analyses_capture_id_captures_id_fk" FOREIGN KEY ("capture_id") REFERENCES "public"."captures"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "captures" ADD CONSTRAINT "captures_unit_id_units_id_fk" FOREIGN KEY ("unit_id") REFERENCES "public"."units"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "captures" ADD CONSTRAINT "captures_lab_id_organisations_id_fk" FOREIGN KEY ("lab_id") REFERENCES "public"."organisations"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "captures" ADD CONSTRAINT "captures_station_id_stations_id_fk" FOREIGN KEY ("station_id") REFERENCES "public"."stations"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "captures" ADD CONSTRAINT "captures_uploaded_by_id_users_id_fk" FOREIGN KEY ("uploaded_by_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "captures" ADD CONSTRAINT "captures_station_key_id_station_keys_id_fk" FOREIGN KEY ("station_key_id") REFERENCES "public"."station_keys"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "ratings" ADD CONSTRAINT "ratings_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "station_keys" ADD CONSTRAINT "station_keys_station_id_stations_id_fk" FOREIGN KEY ("station_id") REFERENCES "public"."stations"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "station_keys" ADD CONSTRAINT "station_keys_created_by_id_users_id_fk" FOREIGN KEY ("created_by_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "stations" ADD CONSTRAINT "stations_lab_id_organisations_id_fk" FOREIGN KEY ("lab_id") REFERENCES "public"."organisations"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "unit_events" ADD CONSTRAINT "unit_events_unit_id_units_id_fk" FOREIGN KEY ("unit_id") REFERENCES "public"."units"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "unit_events" ADD CONSTRAINT "unit_events_actor_id_users_id_fk" FOREIGN KEY ("actor_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "units" ADD CONSTRAINT "units_rating_id_ratings_id_fk" FOREIGN KEY ("rating_id") REFERENCES "public"."ratings"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "units" ADD CONSTRAINT "units_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "units" ADD CONSTRAINT "units_lab_id_organisations_id_fk" FOREIGN KEY ("lab_id") REFERENCES "public"."organisations"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "users" ADD CONSTRAINT "users_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "analyses_capture_idx" ON "analyses" USING btree ("capture_id","created_at");--> statement-breakpoint
CREATE UNIQUE INDEX "analyses_capture_current_idx" ON "analyses" USING btree ("capture_id") WHERE "analyses"."current";--> statement-breakpoint
CREATE UNIQUE INDEX "captures_unit_sha_idx" ON "captures" USING btree ("unit_id","sha256");--> statement-breakpoint
CREATE INDEX "captures_lab_created_idx" ON "captures" USING btree ("lab_id","created_at");--> statement-breakpoint
CREATE INDEX "captures_state_idx" ON "captures" USING btree ("state","updated_at");--> statement-breakpoint
CREATE INDEX "captures_unit_idx" ON "captures" USING btree ("unit_id","created_at");--> statement-breakpoint
CREATE UNIQUE INDEX "ratings_org_model_idx" ON "ratings" USING btree ("organisation_id","model_code");--> statement-breakpoint
CREATE INDEX "sign_in_attempts_email_idx" ON "sign_in_attempts" USING btree ("email","at");--> statement-breakpoint
CREATE INDEX "sign_in_attempts_address_idx" ON "sign_in_attempts" USING btree ("address","at");--> statement-breakpoint
CREATE INDEX "unit_events_unit_idx" ON "unit_events" USING btree ("unit_id","created_at");--> statement-breakpoint
CREATE UNIQUE INDEX "units_lab_serial_idx" ON "units" USING btree ("lab_id","serial");--> statement-breakpoint
CREATE INDEX "units_org_idx" ON "units" USING btree ("organisation_id","serial");--> statement-breakpoint
CREATE INDEX "units_overall_idx" ON "units" USING btree ("lab_id","latest_overall");--> statement-breakpoint
CREATE UNIQUE INDEX "users_email_lower_idx" ON "users" USING btree (lower("email"));--> statement-breakpoint
CREATE INDEX "users_org_idx" ON "users" USING btree ("organisation_id");