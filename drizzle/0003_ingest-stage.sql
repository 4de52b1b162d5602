CREATE TABLE "tag_hours_stage" (
	"upload_id" uuid NOT NULL,
	"tag_name" text NOT NULL,
	"hour_start" timestamp with time zone NOT NULL,
	"mean" double precision,
	"min" double precision,
	"max" double precision,
	"std" double precision,
	"first" double precision,
	"last" double precision,
	"samples" integer NOT NULL,
	"covered_seconds" double precision NOT NULL,
	"non_numeric" integer NOT NULL,
	"out_of_range" integer NOT NULL,
	"flatline" boolean NOT NULL,
	"span_start" timestamp (3) with time zone,
	"span_end" timestamp (3) with time zone,
	"flags" text[] NOT NULL,
	CONSTRAINT "tag_hours_stage_upload_id_tag_name_hour_start_pk" PRIMARY KEY("upload_id","tag_name","hour_start")
);
--> statement-breakpoint
ALTER TABLE "tag_hours_stage" ADD CONSTRAINT "tag_hours_stage_upload_id_uploads_id_fk" FOREIGN KEY ("upload_id") REFERENCES "public"."uploads"("id") ON DELETE cascade ON UPDATE no action;