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
ALTER TABLE "user" ADD COLUMN "all_sites" boolean DEFAULT true NOT NULL;--> statement-breakpoint
ALTER TABLE "person_sites" ADD CONSTRAINT "person_sites_user_id_user_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."user"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "person_sites" ADD CONSTRAINT "person_sites_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "person_sites_site_idx" ON "person_sites" USING btree ("site_id");--> statement-breakpoint
-- Reset and invitation links are stored hashed from now on: links still stored in the clear end here (ask for a new one).
DELETE FROM "verification" WHERE "identifier" LIKE 'reset-password:%';
