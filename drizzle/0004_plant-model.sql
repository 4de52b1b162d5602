CREATE TABLE "plant_ports" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"unit_id" uuid NOT NULL,
	"name" text NOT NULL,
	"slot" text NOT NULL,
	"role" text NOT NULL,
	"stream" text DEFAULT 'matter' NOT NULL,
	"fluid" jsonb,
	"boundary_t_k" double precision,
	"account" text,
	"position" integer DEFAULT 0 NOT NULL
);
--> statement-breakpoint
CREATE TABLE "plant_units" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"site_id" uuid NOT NULL,
	"name" text NOT NULL,
	"kind" text NOT NULL,
	"description" text,
	"parameters" jsonb DEFAULT '{}'::jsonb NOT NULL,
	"fuel" jsonb,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "tag_links" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"site_id" uuid NOT NULL,
	"unit_id" uuid NOT NULL,
	"port_id" uuid,
	"tag_id" uuid NOT NULL,
	"quantity" text NOT NULL,
	"eng_unit" text NOT NULL,
	"basis" text,
	"uncertainty_mode" text NOT NULL,
	"uncertainty" double precision NOT NULL,
	"valid_min" double precision,
	"valid_max" double precision,
	"valid_from" timestamp with time zone NOT NULL,
	"valid_to" timestamp with time zone,
	"created_by" text,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
ALTER TABLE "sites" ADD COLUMN "elevation_m" double precision;--> statement-breakpoint
ALTER TABLE "sites" ADD COLUMN "p_atm_pa" double precision DEFAULT 101325 NOT NULL;--> statement-breakpoint
ALTER TABLE "sites" ADD COLUMN "t0_k" double precision DEFAULT 298.15 NOT NULL;--> statement-breakpoint
ALTER TABLE "sites" ADD COLUMN "p0_pa" double precision DEFAULT 101325 NOT NULL;--> statement-breakpoint
ALTER TABLE "sites" ADD COLUMN "t0_tag_id" uuid;--> statement-breakpoint
ALTER TABLE "sites" ADD COLUMN "t0_tag_unit" text;--> statement-breakpoint
ALTER TABLE "sites" ADD COLUMN "currency" text DEFAULT 'EUR' NOT NULL;--> statement-breakpoint
ALTER TABLE "sites" ADD COLUMN "prices" jsonb DEFAULT '[]'::jsonb NOT NULL;--> statement-breakpoint
ALTER TABLE "sites" ADD COLUMN "updated_at" timestamp with time zone DEFAULT now() NOT NULL;--> statement-breakpoint
ALTER TABLE "plant_ports" ADD CONSTRAINT "plant_ports_unit_id_plant_units_id_fk" FOREIGN KEY ("unit_id") REFERENCES "public"."plant_units"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "plant_units" ADD CONSTRAINT "plant_units_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "tag_links" ADD CONSTRAINT "tag_links_site_id_sites_id_fk" FOREIGN KEY ("site_id") REFERENCES "public"."sites"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "tag_links" ADD CONSTRAINT "tag_links_unit_id_plant_units_id_fk" FOREIGN KEY ("unit_id") REFERENCES "public"."plant_units"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "tag_links" ADD CONSTRAINT "tag_links_port_id_plant_ports_id_fk" FOREIGN KEY ("port_id") REFERENCES "public"."plant_ports"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "tag_links" ADD CONSTRAINT "tag_links_tag_id_tags_id_fk" FOREIGN KEY ("tag_id") REFERENCES "public"."tags"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "tag_links" ADD CONSTRAINT "tag_links_created_by_user_id_fk" FOREIGN KEY ("created_by") REFERENCES "public"."user"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE UNIQUE INDEX "plant_ports_unit_name" ON "plant_ports" USING btree ("unit_id","name");--> statement-breakpoint
CREATE UNIQUE INDEX "plant_units_site_name" ON "plant_units" USING btree ("site_id","name");--> statement-breakpoint
CREATE INDEX "tag_links_site_time" ON "tag_links" USING btree ("site_id","valid_from");--> statement-breakpoint
CREATE INDEX "tag_links_unit" ON "tag_links" USING btree ("unit_id","port_id","quantity");--> statement-breakpoint
CREATE INDEX "tag_links_tag" ON "tag_links" USING btree ("tag_id");--> statement-breakpoint
ALTER TABLE "sites" ADD CONSTRAINT "sites_t0_tag_id_tags_id_fk" FOREIGN KEY ("t0_tag_id") REFERENCES "public"."tags"("id") ON DELETE set null ON UPDATE no action;