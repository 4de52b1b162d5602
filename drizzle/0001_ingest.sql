CREATE TABLE "layout_profiles" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"site_id" uuid NOT NULL,
	"fingerprint" text NOT NULL,
	"name" text NOT NULL,
	"profile" jsonb NOT NULL,
	"confirmed_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "tag_hour_edges" (
	"tag_id" uuid NOT NULL,
	"hour_start" timestamp with time zone NOT NULL,
	"upload_id" uuid NOT NULL,
	"samples" "bytea" NOT NULL,
	CONSTRAINT "tag_hour_edges_tag_id_hour_start_upload_id_pk" PRIMARY KEY("tag_id","hour_start","upload_id")
);
--> statement-breakpoint
CREATE TABLE "tag_hour_history" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"tag_id" uuid NOT NULL,
	"hour_start" timestamp with time zone NOT NULL,
	"replaced_by_upload_id" uuid NOT NULL,
	"previous" jsonb NOT NULL,
	"replaced_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "tag_hours" (
	"tag_id" uuid NOT NULL,
	"hour_start" timestamp with time zone NOT NULL,
	"mean" double precision,
	"min" double precision,
	"max" double precision,
	"std" double precision,
	"first" double precision,
	"last" double precision,
	"samples" integer NOT NULL,
	"covered_fraction" double precision NOT NULL,
	"non_numeric" integer DEFAULT 0 NOT NULL,
	"out_of_range" integer DEFAULT 0 NOT NULL,
	"flatline" boolean DEFAULT false NOT NULL,
	"upload_ids" uuid[] NOT NULL,
	"flags" text[] DEFAULT '{}'::text[] NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "tag_hours_tag_id_hour_start_pk" PRIMARY KEY("tag_id","hour_start")
);
--> statement-breakpoint
CREATE TABLE "tags" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"site_id" uuid NOT NULL,
	"name" text NOT NULL,
	"unit_hint" text,
	"description" text,
	"kind" text DEFAULT 'analog' NOT NULL,
	"flatline_limit_seconds" integer DEFAULT 14400 NOT NULL,
	"valid_min" double precision,
	"valid_max" double precision,
	"first_seen_at" timestamp with time zone DEFAULT now() NOT NULL,
	"last_upload_id" uuid
);
--> statement-breakpoint
CREATE TABLE "upload_rejects" (
	"upload_id" uuid NOT NULL,
	"seq" integer NOT NULL,
	"line" bigint,
	"tag" text,
	"time" text,
	"raw" text,
	"reason" text NOT NULL,
	CONSTRAINT "upload_rejects_upload_id_seq_pk" PRIMARY KEY("upload_id","seq")
);
--> statement-breakpoint
CREATE TABLE "uploads" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"site_id" uuid NOT NULL,
	"file_name" text NOT NULL,
	"size_bytes" bigint,
	"sha256" text,
	"object_key" text NOT NULL,
	"source" text NOT NULL,
	"uploaded_by" text,
	"api_token_id" uuid,
	"status" text DEFAULT 'awaiting-file' NOT NULL,
	"duplicate_of" uuid,
	"profile_id" uuid,
	"rows_read" bigint DEFAULT 0 NOT NULL,
	"bytes_read" bigint DEFAULT 0 NOT NULL,
	"summary" jsonb,
	"detection" jsonb,
	"failure_reason" text,
	"attempts" integer DEFAULT 0 NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"started_at" timestamp with time zone,
	"finished_at" timestamp with time zone,
	CONSTRAINT "uploads_object_key_unique" UNIQUE("object_key")
);
--> statement-breakpoint
ALTER TABLE "layout_profiles" ADD CONSTRAINT "layout_profiles_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "layout_profiles" ADD CONSTRAINT "layout_profiles_confirmed_by_user_id_fk" FOREIGN KEY ("confirmed_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "tag_hour_edges" ADD CONSTRAINT "tag_hour_edges_tag_id_tags_id_fk" FOREIGN KEY ("tag_id") REFERENCES "public"."tags"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "tag_hour_edges" ADD CONSTRAINT "tag_hour_edges_upload_id_uploads_id_fk" FOREIGN KEY ("upload_id") REFERENCES "public"."uploads"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "tag_hours" ADD CONSTRAINT "tag_hours_tag_id_tags_id_fk" FOREIGN KEY ("tag_id") REFERENCES "public"."tags"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "tags" ADD CONSTRAINT "tags_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "upload_rejects" ADD CONSTRAINT "upload_rejects_upload_id_uploads_id_fk" FOREIGN KEY ("upload_id") REFERENCES "public"."uploads"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "uploads" ADD CONSTRAINT "uploads_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "uploads" ADD CONSTRAINT "uploads_uploaded_by_user_id_fk" FOREIGN KEY ("uploaded_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "layout_profiles_site_fp" ON "layout_profiles" USING btree ("site_id","fingerprint");--> statement-breakpoint
CREATE INDEX "tag_hour_history_tag_idx" ON "tag_hour_history" USING btree ("tag_id","hour_start");--> statement-breakpoint
CREATE INDEX "tag_hours_hour_idx" ON "tag_hours" USING btree ("hour_start");--> statement-breakpoint
CREATE UNIQUE INDEX "tags_site_name" ON "tags" USING btree ("site_id","name");--> statement-breakpoint
CREATE INDEX "uploads_site_idx" ON "uploads" USING btree ("site_id","created_at");--> statement-breakpoint
CREATE INDEX "uploads_sha_idx" ON "uploads" USING btree ("site_id","sha256");