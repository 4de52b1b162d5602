ALTER TABLE "tags" ADD COLUMN "spread_limit" double precision;--> statement-breakpoint
ALTER TABLE "tags" ADD COLUMN "min_coverage" double precision;