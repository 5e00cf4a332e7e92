ALTER TABLE "analyses" ADD COLUMN "spectrum" jsonb;--> statement-breakpoint
ALTER TABLE "captures" ADD COLUMN "object_etag" text;--> statement-breakpoint
ALTER TABLE "captures" ADD COLUMN "uploaded_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "captures" ADD COLUMN "analysed_at" timestamp with time zone;