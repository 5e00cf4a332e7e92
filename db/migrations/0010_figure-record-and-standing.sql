DROP INDEX "analysis_figures_trend_idx";--> statement-breakpoint
ALTER TABLE "units" ADD COLUMN "plan_standing" jsonb;--> statement-breakpoint
ALTER TABLE "analysis_figures" ADD COLUMN "plan_step_id" uuid;--> statement-breakpoint
-- Filled from the analyses before the key is added, so the key is checked in one pass, not row by row.
UPDATE "analysis_figures" f SET "plan_step_id" = a."plan_step_id" FROM "analyses" a WHERE a."id" = f."analysis_id" AND a."plan_step_id" IS NOT NULL;--> statement-breakpoint
ALTER TABLE "analysis_figures" ADD CONSTRAINT "analysis_figures_plan_step_id_plan_steps_id_fk" FOREIGN KEY ("plan_step_id") REFERENCES "public"."plan_steps"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "analysis_figures_record_idx" ON "analysis_figures" USING btree ("rating_id","figure","harmonic_order","unit_id","measured_at","lab_id","capture_id","plan_step_id","value","status","flagged","expanded_uncertainty") WHERE "analysis_figures"."current";--> statement-breakpoint
ANALYZE "analysis_figures";
