CREATE TABLE "site_quality_codes" (
	"site_id" uuid PRIMARY KEY NOT NULL,
	"good_codes" jsonb NOT NULL,
	"updated_by" text,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "site_quality_codes" ADD CONSTRAINT "site_quality_codes_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "site_quality_codes" ADD CONSTRAINT "site_quality_codes_updated_by_user_id_fk" FOREIGN KEY ("updated_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;