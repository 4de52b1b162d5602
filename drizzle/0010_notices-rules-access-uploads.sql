CREATE TABLE "person_sites" (
	"user_id" text NOT NULL,
	"site_id" uuid NOT NULL,
	"granted_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "person_sites_user_id_site_id_pk" PRIMARY KEY("user_id","site_id")
);
--> statement-breakpoint
CREATE TABLE "sign_in_failures" (
	"email" text PRIMARY KEY NOT NULL,
	"failures" integer DEFAULT 0 NOT NULL,
	"last_failure_at" timestamp with time zone DEFAULT now() NOT NULL,
	"paused_until" timestamp with time zone
);
--> statement-breakpoint
CREATE TABLE "notice_escalations" (
	"notice_id" uuid NOT NULL,
	"step" integer NOT NULL,
	"user_id" text NOT NULL,
	"cost_per_day" double precision NOT NULL,
	"queued_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "notice_escalations_notice_id_step_user_id_pk" PRIMARY KEY("notice_id","step","user_id")
);
--> statement-breakpoint
CREATE TABLE "notice_site_settings" (
	"site_id" uuid PRIMARY KEY NOT NULL,
	"escalation_multiple" double precision DEFAULT 2 NOT NULL,
	"updated_by" text,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
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
ALTER TABLE "user" ADD COLUMN "all_sites" boolean DEFAULT true NOT NULL;--> statement-breakpoint
ALTER TABLE "plant_units" ADD COLUMN "normally_idle" jsonb;--> statement-breakpoint
ALTER TABLE "uploads" ADD COLUMN "declared_sha256" text;--> statement-breakpoint
ALTER TABLE "drift_notices" ADD COLUMN "kind" text DEFAULT 'drift' NOT NULL;--> statement-breakpoint
ALTER TABLE "drift_notices" ADD COLUMN "rule_text" text;--> statement-breakpoint
ALTER TABLE "drift_notices" ADD COLUMN "rule_hours" integer;--> statement-breakpoint
ALTER TABLE "drift_notices" ADD COLUMN "rule_crossed" jsonb;--> statement-breakpoint
ALTER TABLE "drift_notices" ADD COLUMN "rule_limits" jsonb;--> statement-breakpoint
ALTER TABLE "drift_notices" ADD COLUMN "mean_efficiency" double precision;--> statement-breakpoint
ALTER TABLE "drift_notices" ADD COLUMN "current_w" double precision;--> statement-breakpoint
ALTER TABLE "drift_notices" ADD COLUMN "current_u_w" double precision;--> statement-breakpoint
ALTER TABLE "drift_notices" ADD COLUMN "current_meas_u_w" double precision;--> statement-breakpoint
ALTER TABLE "drift_notices" ADD COLUMN "current_hours" integer;--> statement-breakpoint
ALTER TABLE "drift_notices" ADD COLUMN "current_exceeds" boolean;--> statement-breakpoint
ALTER TABLE "drift_notices" ADD COLUMN "current_cost_per_day" double precision;--> statement-breakpoint
ALTER TABLE "drift_notices" ADD COLUMN "current_cost_u_per_day" double precision;--> statement-breakpoint
ALTER TABLE "drift_notices" ADD COLUMN "since_onset_w" double precision;--> statement-breakpoint
ALTER TABLE "drift_notices" ADD COLUMN "since_onset_u_w" double precision;--> statement-breakpoint
ALTER TABLE "drift_notices" ADD COLUMN "since_onset_hours" integer;--> statement-breakpoint
ALTER TABLE "drift_notices" ADD COLUMN "trend" text;--> statement-breakpoint
ALTER TABLE "drift_notices" ADD COLUMN "figures_hour" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "drift_notices" ADD COLUMN "faded_since" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "drift_notices" ADD COLUMN "superseded_by" uuid;--> statement-breakpoint
ALTER TABLE "drift_notices" ADD COLUMN "prior_notice_id" uuid;--> statement-breakpoint
ALTER TABLE "drift_notices" ADD COLUMN "prior_reason" text;--> statement-breakpoint
ALTER TABLE "drift_notices" ADD COLUMN "close_outcome" text;--> statement-breakpoint
ALTER TABLE "drift_notices" ADD COLUMN "repaired_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "drift_notices" ADD COLUMN "new_normal_from" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "drift_notices" ADD COLUMN "verdict_hour" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "drift_notices" ADD COLUMN "verdict_back" boolean;--> statement-breakpoint
ALTER TABLE "drift_notices" ADD COLUMN "verdict" jsonb;--> statement-breakpoint
ALTER TABLE "drift_notices" ADD COLUMN "follow_up_notice_id" uuid;--> statement-breakpoint
ALTER TABLE "drift_notices" ADD COLUMN "mailed_cost_per_day" double precision;--> statement-breakpoint
ALTER TABLE "drift_notices" ADD COLUMN "escalation_step" integer DEFAULT 0 NOT NULL;--> statement-breakpoint
ALTER TABLE "person_sites" ADD CONSTRAINT "person_sites_user_id_user_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."user"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "person_sites" ADD CONSTRAINT "person_sites_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "notice_escalations" ADD CONSTRAINT "notice_escalations_notice_id_drift_notices_id_fk" FOREIGN KEY ("notice_id") REFERENCES "public"."drift_notices"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "notice_escalations" ADD CONSTRAINT "notice_escalations_user_id_user_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."user"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "notice_site_settings" ADD CONSTRAINT "notice_site_settings_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "notice_site_settings" ADD CONSTRAINT "notice_site_settings_updated_by_user_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "unit_limits" ADD CONSTRAINT "unit_limits_unit_id_plant_units_id_fk" FOREIGN KEY ("unit_id") REFERENCES "public"."plant_units"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "unit_limits" ADD CONSTRAINT "unit_limits_updated_by_user_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "person_sites_site_idx" ON "person_sites" USING btree ("site_id");--> statement-breakpoint
ALTER TABLE "drift_notices" ADD CONSTRAINT "drift_notices_prior_notice_id_drift_notices_id_fk" FOREIGN KEY ("prior_notice_id") REFERENCES "public"."drift_notices"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "drift_notices" ADD CONSTRAINT "drift_notices_follow_up_notice_id_drift_notices_id_fk" FOREIGN KEY ("follow_up_notice_id") REFERENCES "public"."drift_notices"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "drift_notices_one_open" ON "drift_notices" USING btree ("unit_id","kind","direction") WHERE status <> 'closed' and faded_since is null and superseded_by is null;--> statement-breakpoint
-- Reset and invitation links are stored hashed from now on: links still stored in the clear end here (ask for a new one).
DELETE FROM "verification" WHERE "identifier" LIKE 'reset-password:%';
