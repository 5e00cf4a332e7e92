CREATE TYPE "public"."plan_state" AS ENUM('incomplete', 'complete-within', 'failed', 'inconclusive');--> statement-breakpoint
ALTER TYPE "public"."verdict_status" ADD VALUE 'inconclusive';--> statement-breakpoint
ALTER TYPE "public"."verdict_status" ADD VALUE 'not-required';--> statement-breakpoint
CREATE TABLE "capture_corrections" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"capture_id" uuid NOT NULL,
	"actor_id" uuid,
	"station_key_id" uuid,
	"reason" text NOT NULL,
	"before" jsonb NOT NULL,
	"after" jsonb NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "import_profiles" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"station_id" uuid NOT NULL,
	"header_signature" text NOT NULL,
	"header_preview" text NOT NULL,
	"settings" jsonb NOT NULL,
	"updated_by_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "lab_clients" (
	"lab_id" uuid NOT NULL,
	"client_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "lab_clients_lab_id_client_id_pk" PRIMARY KEY("lab_id","client_id")
);
--> statement-breakpoint
CREATE TABLE "plan_steps" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"rating_id" uuid NOT NULL,
	"position" integer NOT NULL,
	"name" text NOT NULL,
	"test_kind" "test_kind" NOT NULL,
	"speed_min_rpm" double precision NOT NULL,
	"speed_max_rpm" double precision NOT NULL,
	"required_roles" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"checks" jsonb NOT NULL,
	"retired_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "step_records" (
	"unit_id" uuid NOT NULL,
	"plan_step_id" uuid NOT NULL,
	"capture_id" uuid NOT NULL,
	"reason" text NOT NULL,
	"chosen_by_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "step_records_unit_id_plan_step_id_pk" PRIMARY KEY("unit_id","plan_step_id")
);
--> statement-breakpoint
CREATE TABLE "tolerance_profiles" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"rating_id" uuid NOT NULL,
	"version" integer NOT NULL,
	"profile" jsonb NOT NULL,
	"reason" text NOT NULL,
	"created_by_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
DROP INDEX "ratings_org_model_idx";--> statement-breakpoint
ALTER TABLE "analyses" ADD COLUMN "profile_version_id" uuid;--> statement-breakpoint
ALTER TABLE "analyses" ADD COLUMN "plan_step_id" uuid;--> statement-breakpoint
ALTER TABLE "analyses" ADD COLUMN "kind" text DEFAULT 'analysis' NOT NULL;--> statement-breakpoint
ALTER TABLE "captures" ADD COLUMN "plan_step_id" uuid;--> statement-breakpoint
ALTER TABLE "captures" ADD COLUMN "channel_offsets" jsonb DEFAULT '{}'::jsonb NOT NULL;--> statement-breakpoint
ALTER TABLE "captures" ADD COLUMN "magnet_temperature_c" double precision;--> statement-breakpoint
ALTER TABLE "organisations" ADD COLUMN "address" text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE "organisations" ADD COLUMN "contact_email" text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE "organisations" ADD COLUMN "reference_code" text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE "organisations" ADD COLUMN "deactivated_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "ratings" ADD COLUMN "lab_id" uuid;--> statement-breakpoint
-- Existing ratings belong to the lab that tests their units (else the first lab); clients are linked to the labs that test their units.
UPDATE "ratings" r SET "lab_id" = coalesce((SELECT u."lab_id" FROM "units" u WHERE u."rating_id" = r."id" LIMIT 1), (SELECT o."id" FROM "organisations" o WHERE o."kind" = 'lab' ORDER BY o."created_at" LIMIT 1));--> statement-breakpoint
ALTER TABLE "ratings" ALTER COLUMN "lab_id" SET NOT NULL;--> statement-breakpoint
INSERT INTO "lab_clients" ("lab_id", "client_id") SELECT DISTINCT u."lab_id", u."organisation_id" FROM "units" u ON CONFLICT DO NOTHING;--> statement-breakpoint
INSERT INTO "lab_clients" ("lab_id", "client_id") SELECT DISTINCT r."lab_id", r."organisation_id" FROM "ratings" r ON CONFLICT DO NOTHING;--> statement-breakpoint
-- Nameplates gain their machine kind; a stored line-line Ke becomes a Ke with its basis.
UPDATE "ratings" SET "nameplate" = ("nameplate" - 'keLineRmsPerKrpm') || jsonb_build_object('machineKind', CASE WHEN "nameplate" ? 'keLineRmsPerKrpm' THEN 'pm-generator' ELSE 'wound-field-alternator' END) || CASE WHEN "nameplate" ? 'keLineRmsPerKrpm' THEN jsonb_build_object('ke', jsonb_build_object('value', "nameplate"->'keLineRmsPerKrpm', 'basis', 'line-line-rms-per-krpm')) ELSE '{}'::jsonb END WHERE NOT ("nameplate" ? 'machineKind');--> statement-breakpoint
ALTER TABLE "ratings" ADD COLUMN "retired_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "ratings" ADD COLUMN "updated_at" timestamp with time zone DEFAULT now() NOT NULL;--> statement-breakpoint
ALTER TABLE "unit_events" ADD COLUMN "detail" jsonb;--> statement-breakpoint
ALTER TABLE "units" ADD COLUMN "plan_state" "plan_state" DEFAULT 'incomplete' NOT NULL;--> statement-breakpoint
ALTER TABLE "units" ADD COLUMN "retired_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "units" ADD COLUMN "created_by_id" uuid;--> statement-breakpoint
ALTER TABLE "users" ADD COLUMN "session_version" integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE "capture_corrections" ADD CONSTRAINT "capture_corrections_capture_id_captures_id_fk" FOREIGN KEY ("capture_id") REFERENCES "public"."captures"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "capture_corrections" ADD CONSTRAINT "capture_corrections_actor_id_users_id_fk" FOREIGN KEY ("actor_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "capture_corrections" ADD CONSTRAINT "capture_corrections_station_key_id_station_keys_id_fk" FOREIGN KEY ("station_key_id") REFERENCES "public"."station_keys"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "import_profiles" ADD CONSTRAINT "import_profiles_station_id_stations_id_fk" FOREIGN KEY ("station_id") REFERENCES "public"."stations"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "import_profiles" ADD CONSTRAINT "import_profiles_updated_by_id_users_id_fk" FOREIGN KEY ("updated_by_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lab_clients" ADD CONSTRAINT "lab_clients_lab_id_organisations_id_fk" FOREIGN KEY ("lab_id") REFERENCES "public"."organisations"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "lab_clients" ADD CONSTRAINT "lab_clients_client_id_organisations_id_fk" FOREIGN KEY ("client_id") REFERENCES "public"."organisations"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "plan_steps" ADD CONSTRAINT "plan_steps_rating_id_ratings_id_fk" FOREIGN KEY ("rating_id") REFERENCES "public"."ratings"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "step_records" ADD CONSTRAINT "step_records_unit_id_units_id_fk" FOREIGN KEY ("unit_id") REFERENCES "public"."units"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "step_records" ADD CONSTRAINT "step_records_plan_step_id_plan_steps_id_fk" FOREIGN KEY ("plan_step_id") REFERENCES "public"."plan_steps"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "step_records" ADD CONSTRAINT "step_records_capture_id_captures_id_fk" FOREIGN KEY ("capture_id") REFERENCES "public"."captures"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "step_records" ADD CONSTRAINT "step_records_chosen_by_id_users_id_fk" FOREIGN KEY ("chosen_by_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "tolerance_profiles" ADD CONSTRAINT "tolerance_profiles_rating_id_ratings_id_fk" FOREIGN KEY ("rating_id") REFERENCES "public"."ratings"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "tolerance_profiles" ADD CONSTRAINT "tolerance_profiles_created_by_id_users_id_fk" FOREIGN KEY ("created_by_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "capture_corrections_capture_idx" ON "capture_corrections" USING btree ("capture_id","created_at");--> statement-breakpoint
CREATE UNIQUE INDEX "import_profiles_station_header_idx" ON "import_profiles" USING btree ("station_id","header_signature");--> statement-breakpoint
CREATE INDEX "lab_clients_client_idx" ON "lab_clients" USING btree ("client_id");--> statement-breakpoint
CREATE INDEX "plan_steps_rating_idx" ON "plan_steps" USING btree ("rating_id","position");--> statement-breakpoint
CREATE UNIQUE INDEX "tolerance_profiles_rating_version_idx" ON "tolerance_profiles" USING btree ("rating_id","version");--> statement-breakpoint
ALTER TABLE "analyses" ADD CONSTRAINT "analyses_profile_version_id_tolerance_profiles_id_fk" FOREIGN KEY ("profile_version_id") REFERENCES "public"."tolerance_profiles"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "analyses" ADD CONSTRAINT "analyses_plan_step_id_plan_steps_id_fk" FOREIGN KEY ("plan_step_id") REFERENCES "public"."plan_steps"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "captures" ADD CONSTRAINT "captures_plan_step_id_plan_steps_id_fk" FOREIGN KEY ("plan_step_id") REFERENCES "public"."plan_steps"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "ratings" ADD CONSTRAINT "ratings_lab_id_organisations_id_fk" FOREIGN KEY ("lab_id") REFERENCES "public"."organisations"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "units" ADD CONSTRAINT "units_created_by_id_users_id_fk" FOREIGN KEY ("created_by_id") REFERENCES "public"."users"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "ratings_lab_org_model_idx" ON "ratings" USING btree ("lab_id","organisation_id","model_code");--> statement-breakpoint
ALTER TABLE "ratings" DROP COLUMN "tolerance";