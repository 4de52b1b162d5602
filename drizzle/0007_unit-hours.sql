CREATE TABLE "unit_hours" (
	"unit_id" uuid NOT NULL,
	"hour_start" timestamp with time zone NOT NULL,
	"state" text NOT NULL,
	"reasons" jsonb DEFAULT '[]'::jsonb NOT NULL,
	"load" double precision,
	"load_unit" text,
	"t0_k" double precision,
	"p0_pa" double precision,
	"fuel_w" double precision,
	"product_w" double precision,
	"loss_w" double precision,
	"destruction_w" double precision,
	"efficiency" double precision,
	"efficiency_u" double precision,
	"destruction_u_w" double precision,
	"closure_pct" double precision,
	"entropy_generation_w_per_k" double precision,
	"destruction_cost_per_h" double precision,
	"detail" jsonb,
	"model_version" text NOT NULL,
	"inputs_hash" text NOT NULL,
	"computed_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "unit_hours_unit_id_hour_start_pk" PRIMARY KEY("unit_id","hour_start")
);
--> statement-breakpoint
ALTER TABLE "unit_hours" ADD CONSTRAINT "unit_hours_unit_id_plant_units_id_fk" FOREIGN KEY ("unit_id") REFERENCES "public"."plant_units"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "unit_hours_state_idx" ON "unit_hours" USING btree ("unit_id","state","hour_start");