CREATE TABLE "unit_limits" (
	"unit_id" uuid PRIMARY KEY NOT NULL,
	"max_cost_per_day" double precision,
	"min_efficiency" double precision,
	"hours" integer DEFAULT 3 NOT NULL,
	"updated_by" text,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
DROP INDEX "drift_notices_one_open";--> statement-breakpoint
ALTER TABLE "plant_units" ADD COLUMN "normally_idle" jsonb;--> statement-breakpoint
ALTER TABLE "drift_notices" ADD COLUMN "kind" text DEFAULT 'drift' NOT NULL;--> statement-breakpoint
ALTER TABLE "drift_notices" ADD COLUMN "rule_text" text;--> statement-breakpoint
ALTER TABLE "drift_notices" ADD COLUMN "rule_hours" integer;--> statement-breakpoint
ALTER TABLE "drift_notices" ADD COLUMN "rule_crossed" jsonb;--> statement-breakpoint
ALTER TABLE "drift_notices" ADD COLUMN "rule_limits" jsonb;--> statement-breakpoint
ALTER TABLE "drift_notices" ADD COLUMN "mean_efficiency" double precision;--> statement-breakpoint
ALTER TABLE "unit_limits" ADD CONSTRAINT "unit_limits_unit_id_plant_units_id_fk" FOREIGN KEY ("unit_id") REFERENCES "public"."plant_units"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "unit_limits" ADD CONSTRAINT "unit_limits_updated_by_user_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "drift_notices_one_open" ON "drift_notices" USING btree ("unit_id","kind","direction") WHERE status <> 'closed';