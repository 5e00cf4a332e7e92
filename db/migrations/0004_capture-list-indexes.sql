CREATE INDEX "analyses_current_thd_idx" ON "analyses" USING btree ("worst_thd_percent" DESC NULLS LAST) WHERE "analyses"."current";--> statement-breakpoint
CREATE INDEX "analyses_current_vuf_idx" ON "analyses" USING btree ("vuf_percent" DESC NULLS LAST) WHERE "analyses"."current";--> statement-breakpoint
CREATE INDEX "analyses_current_ke_idx" ON "analyses" USING btree ("ke_line_rms_per_krpm" DESC NULLS LAST) WHERE "analyses"."current";--> statement-breakpoint
CREATE INDEX "analyses_current_frequency_idx" ON "analyses" USING btree ("frequency_hz" DESC NULLS LAST) WHERE "analyses"."current";