CREATE TABLE "baselines" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"unit_id" uuid NOT NULL,
	"version" integer NOT NULL,
	"status" text DEFAULT 'draft' NOT NULL,
	"period_from" timestamp with time zone NOT NULL,
	"period_to" timestamp with time zone NOT NULL,
	"terms" jsonb NOT NULL,
	"hours" integer NOT NULL,
	"efficiency_model" jsonb,
	"destruction_model" jsonb NOT NULL,
	"load_unit" text,
	"note" text,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"decided_by" text,
	"decided_at" timestamp with time zone,
	"retired_at" timestamp with time zone
);
--> statement-breakpoint
CREATE TABLE "drift_notices" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"site_id" uuid NOT NULL,
	"unit_id" uuid NOT NULL,
	"baseline_id" uuid,
	"direction" text NOT NULL,
	"status" text DEFAULT 'open' NOT NULL,
	"onset_hour" timestamp with time zone NOT NULL,
	"signal_hour" timestamp with time zone NOT NULL,
	"last_signal_hour" timestamp with time zone NOT NULL,
	"hours" integer NOT NULL,
	"extra_w" double precision NOT NULL,
	"expected_w" double precision NOT NULL,
	"shift_sigma" double precision NOT NULL,
	"extra_cost_per_day" double precision,
	"currency" text NOT NULL,
	"cf_per_j" double precision,
	"cost_basis" text,
	"hour_u_w" double precision,
	"shift_u_w" double precision,
	"exceeds_uncertainty" boolean,
	"k" double precision NOT NULL,
	"h" double precision NOT NULL,
	"opened_at" timestamp with time zone DEFAULT now() NOT NULL,
	"acknowledged_by" text,
	"acknowledged_at" timestamp with time zone,
	"acknowledge_comment" text,
	"closed_by" text,
	"closed_at" timestamp with time zone,
	"close_comment" text
);
--> statement-breakpoint
CREATE TABLE "drift_points" (
	"unit_id" uuid NOT NULL,
	"hour_start" timestamp with time zone NOT NULL,
	"baseline_id" uuid NOT NULL,
	"step" integer NOT NULL,
	"destruction_w" double precision NOT NULL,
	"expected_w" double precision NOT NULL,
	"residual_w" double precision NOT NULL,
	"x" double precision NOT NULL,
	"c_plus" double precision NOT NULL,
	"c_minus" double precision NOT NULL,
	"n_plus" integer NOT NULL,
	"n_minus" integer NOT NULL,
	"destruction_u_w" double precision,
	"destruction_cost_per_h" double precision,
	CONSTRAINT "drift_points_unit_id_hour_start_pk" PRIMARY KEY("unit_id","hour_start")
);
--> statement-breakpoint
CREATE TABLE "drift_settings" (
	"unit_id" uuid PRIMARY KEY NOT NULL,
	"k" double precision DEFAULT 0.5 NOT NULL,
	"h" double precision DEFAULT 5 NOT NULL,
	"updated_by" text,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "notice_digests" (
	"user_id" text NOT NULL,
	"day" date NOT NULL,
	"notices" integer NOT NULL,
	"queued_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "notice_digests_user_id_day_pk" PRIMARY KEY("user_id","day")
);
--> statement-breakpoint
CREATE TABLE "notice_mails" (
	"notice_id" uuid NOT NULL,
	"user_id" text NOT NULL,
	"queued_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "notice_mails_notice_id_user_id_pk" PRIMARY KEY("notice_id","user_id")
);
--> statement-breakpoint
CREATE TABLE "notice_preferences" (
	"user_id" text PRIMARY KEY NOT NULL,
	"daily_digest" boolean DEFAULT false NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "baselines" ADD CONSTRAINT "baselines_unit_id_plant_units_id_fk" FOREIGN KEY ("unit_id") REFERENCES "public"."plant_units"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "baselines" ADD CONSTRAINT "baselines_created_by_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "baselines" ADD CONSTRAINT "baselines_decided_by_user_id_fk" FOREIGN KEY ("decided_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "drift_notices" ADD CONSTRAINT "drift_notices_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "drift_notices" ADD CONSTRAINT "drift_notices_unit_id_plant_units_id_fk" FOREIGN KEY ("unit_id") REFERENCES "public"."plant_units"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "drift_notices" ADD CONSTRAINT "drift_notices_baseline_id_baselines_id_fk" FOREIGN KEY ("baseline_id") REFERENCES "public"."baselines"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "drift_notices" ADD CONSTRAINT "drift_notices_acknowledged_by_user_id_fk" FOREIGN KEY ("acknowledged_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "drift_notices" ADD CONSTRAINT "drift_notices_closed_by_user_id_fk" FOREIGN KEY ("closed_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "drift_points" ADD CONSTRAINT "drift_points_unit_id_plant_units_id_fk" FOREIGN KEY ("unit_id") REFERENCES "public"."plant_units"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "drift_points" ADD CONSTRAINT "drift_points_baseline_id_baselines_id_fk" FOREIGN KEY ("baseline_id") REFERENCES "public"."baselines"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "drift_settings" ADD CONSTRAINT "drift_settings_unit_id_plant_units_id_fk" FOREIGN KEY ("unit_id") REFERENCES "public"."plant_units"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "drift_settings" ADD CONSTRAINT "drift_settings_updated_by_user_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "notice_digests" ADD CONSTRAINT "notice_digests_user_id_user_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."user"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "notice_mails" ADD CONSTRAINT "notice_mails_notice_id_drift_notices_id_fk" FOREIGN KEY ("notice_id") REFERENCES "public"."drift_notices"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "notice_mails" ADD CONSTRAINT "notice_mails_user_id_user_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."user"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "notice_preferences" ADD CONSTRAINT "notice_preferences_user_id_user_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."user"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "baselines_unit_version" ON "baselines" USING btree ("unit_id","version");--> statement-breakpoint
CREATE UNIQUE INDEX "baselines_one_active" ON "baselines" USING btree ("unit_id") WHERE status = 'active';--> statement-breakpoint
CREATE UNIQUE INDEX "drift_notices_one_open" ON "drift_notices" USING btree ("unit_id","direction") WHERE status <> 'closed';--> statement-breakpoint
CREATE INDEX "drift_notices_status" ON "drift_notices" USING btree ("status","opened_at");--> statement-breakpoint
CREATE INDEX "drift_points_step" ON "drift_points" USING btree ("unit_id","step");