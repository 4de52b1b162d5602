-- tag_hours and tag_hour_history change shape in 0012_scale-partitions (data kept: the tag id becomes tags.seq).
CREATE TABLE "tag_hour_uploads" (
	"upload_id" uuid NOT NULL,
	"tag_id" integer NOT NULL,
	"first_hour" timestamp with time zone NOT NULL,
	"last_hour" timestamp with time zone NOT NULL,
	CONSTRAINT "tag_hour_uploads_upload_id_tag_id_pk" PRIMARY KEY("upload_id","tag_id")
);
--> statement-breakpoint
DROP INDEX "unit_hours_state_idx";--> statement-breakpoint
ALTER TABLE "sites" ADD COLUMN "retention_months" integer;--> statement-breakpoint
ALTER TABLE "tags" ADD COLUMN "seq" integer NOT NULL GENERATED ALWAYS AS IDENTITY (sequence name "tags_seq_seq" INCREMENT BY 1 MINVALUE 1 MAXVALUE 2147483647 START WITH 1 CACHE 1);--> statement-breakpoint
ALTER TABLE "tag_hour_uploads" ADD CONSTRAINT "tag_hour_uploads_upload_id_uploads_id_fk" FOREIGN KEY ("upload_id") REFERENCES "public"."uploads"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "tag_hour_uploads_tag" ON "tag_hour_uploads" USING btree ("tag_id","last_hour");--> statement-breakpoint
ALTER TABLE "unit_hours" DROP COLUMN "detail";--> statement-breakpoint
ALTER TABLE "tags" ADD CONSTRAINT "tags_seq_unique" UNIQUE("seq");