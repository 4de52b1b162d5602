DROP TABLE "tag_hour_edges" CASCADE;--> statement-breakpoint
ALTER TABLE "tag_hours" ADD COLUMN "covered_seconds" double precision DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE "tag_hours" ADD COLUMN "span_start" timestamp (3) with time zone;--> statement-breakpoint
ALTER TABLE "tag_hours" ADD COLUMN "span_end" timestamp (3) with time zone;