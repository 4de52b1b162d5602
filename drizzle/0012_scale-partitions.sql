-- Lean tag hours and unit hours, partitioned by month (docs/scale.md). Data already stored is kept:
-- tag hours move to the new shape (tag by tags.seq, float4 values, covered whole seconds, spans as ms
-- after the hour, remarks as bits), unit hours move as they are. Partition names: <table>_yYYYYmMM,
-- ranges in UTC months (src/server/db/partitions.ts makes later ones).
SELECT set_config('TimeZone', 'UTC', true);
--> statement-breakpoint
CREATE OR REPLACE FUNCTION lossline_month_partitions(tbl text, lo timestamptz, hi timestamptz) RETURNS void AS $$
DECLARE
  m timestamptz := date_trunc('month', lo AT TIME ZONE 'UTC') AT TIME ZONE 'UTC';
  name text;
BEGIN
  IF lo IS NULL OR hi IS NULL THEN RETURN; END IF;
  WHILE m <= hi LOOP
    name := tbl || '_y' || to_char(m AT TIME ZONE 'UTC', 'YYYY') || 'm' || to_char(m AT TIME ZONE 'UTC', 'MM');
    IF to_regclass(name) IS NULL THEN
      EXECUTE format('CREATE TABLE %I PARTITION OF %I FOR VALUES FROM (%L) TO (%L)', name, tbl,
        m, ((m AT TIME ZONE 'UTC') + interval '1 month') AT TIME ZONE 'UTC');
    END IF;
    m := ((m AT TIME ZONE 'UTC') + interval '1 month') AT TIME ZONE 'UTC';
  END LOOP;
END $$ LANGUAGE plpgsql;
--> statement-breakpoint
-- tag_hour_history: the tag by tags.seq, as in tag_hours.
ALTER TABLE "tag_hour_history" ADD COLUMN "tag_seq" integer;
--> statement-breakpoint
UPDATE "tag_hour_history" h SET "tag_seq" = t."seq" FROM "tags" t WHERE t."id" = h."tag_id";
--> statement-breakpoint
DELETE FROM "tag_hour_history" WHERE "tag_seq" IS NULL;
--> statement-breakpoint
ALTER TABLE "tag_hour_history" DROP COLUMN "tag_id";
--> statement-breakpoint
ALTER TABLE "tag_hour_history" RENAME COLUMN "tag_seq" TO "tag_id";
--> statement-breakpoint
ALTER TABLE "tag_hour_history" ALTER COLUMN "tag_id" SET NOT NULL;
--> statement-breakpoint
CREATE INDEX "tag_hour_history_tag_idx" ON "tag_hour_history" USING btree ("tag_id","hour_start");
--> statement-breakpoint
-- tag_hours: rebuilt partitioned, 56 bytes of data per row, no padding.
ALTER TABLE "tag_hours" RENAME TO "tag_hours_before_scale";
--> statement-breakpoint
ALTER TABLE "tag_hours_before_scale" DROP CONSTRAINT "tag_hours_tag_id_hour_start_pk";
--> statement-breakpoint
CREATE TABLE "tag_hours" (
	"hour_start" timestamp with time zone NOT NULL,
	"tag_id" integer NOT NULL,
	"samples" integer NOT NULL,
	"mean" real,
	"min" real,
	"max" real,
	"std" real,
	"first" real,
	"last" real,
	"span_start_ms" integer,
	"span_end_ms" integer,
	"covered_s" smallint DEFAULT 0 NOT NULL,
	"non_numeric" smallint DEFAULT 0 NOT NULL,
	"out_of_range" smallint DEFAULT 0 NOT NULL,
	"flags" smallint DEFAULT 0 NOT NULL,
	CONSTRAINT "tag_hours_tag_id_hour_start_pk" PRIMARY KEY("tag_id","hour_start")
) PARTITION BY RANGE ("hour_start");
--> statement-breakpoint
SELECT lossline_month_partitions('tag_hours', (SELECT min(hour_start) FROM tag_hours_before_scale), (SELECT max(hour_start) FROM tag_hours_before_scale));
--> statement-breakpoint
INSERT INTO "tag_hours"
SELECT o.hour_start, t.seq, o.samples, o.mean, o.min, o.max, o.std, o.first, o.last,
  (extract(epoch FROM o.span_start - o.hour_start) * 1000)::int,
  (extract(epoch FROM o.span_end - o.hour_start) * 1000)::int,
  least(3600, round(o.covered_seconds))::smallint,
  least(32767, o.non_numeric)::smallint,
  least(32767, o.out_of_range)::smallint,
  ((CASE WHEN o.flatline THEN 1 ELSE 0 END) | (SELECT coalesce(bit_or(CASE
      WHEN f LIKE 'duplicate-times%' THEN 2 WHEN f LIKE 'backwards-times%' THEN 4 WHEN f LIKE 'bad-quality%' THEN 8
      WHEN f LIKE 'uncertain-quality%' THEN 16 WHEN f = 'replaced-older-file' THEN 32 WHEN f = 'combined-files' THEN 64 ELSE 0 END), 0)
    FROM unnest(o.flags) f))::smallint
FROM tag_hours_before_scale o JOIN tags t ON t.id = o.tag_id;
--> statement-breakpoint
INSERT INTO "tag_hour_uploads" (upload_id, tag_id, first_hour, last_hour)
SELECT u.u, t.seq, min(o.hour_start), max(o.hour_start)
FROM tag_hours_before_scale o JOIN tags t ON t.id = o.tag_id CROSS JOIN LATERAL unnest(o.upload_ids) AS u(u)
WHERE EXISTS (SELECT 1 FROM uploads x WHERE x.id = u.u)
GROUP BY u.u, t.seq
ON CONFLICT DO NOTHING;
--> statement-breakpoint
DROP TABLE "tag_hours_before_scale";
--> statement-breakpoint
-- The hours of a deleted tag go with it (one statement, not a per-row foreign-key check on every COPY).
CREATE OR REPLACE FUNCTION lossline_drop_tag_hours() RETURNS trigger AS $$
BEGIN
  DELETE FROM tag_hours WHERE tag_id IN (SELECT seq FROM gone);
  DELETE FROM tag_hour_uploads WHERE tag_id IN (SELECT seq FROM gone);
  DELETE FROM tag_hour_history WHERE tag_id IN (SELECT seq FROM gone);
  RETURN NULL;
END $$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE TRIGGER tags_drop_hours AFTER DELETE ON tags REFERENCING OLD TABLE AS gone FOR EACH STATEMENT EXECUTE FUNCTION lossline_drop_tag_hours();
--> statement-breakpoint
-- unit_hours: the same columns, partitioned.
ALTER TABLE "unit_hours" RENAME TO "unit_hours_before_scale";
--> statement-breakpoint
ALTER TABLE "unit_hours_before_scale" DROP CONSTRAINT "unit_hours_unit_id_hour_start_pk";
--> statement-breakpoint
ALTER TABLE "unit_hours_before_scale" DROP CONSTRAINT "unit_hours_unit_id_plant_units_id_fk";
--> statement-breakpoint
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
	"model_version" text NOT NULL,
	"inputs_hash" text NOT NULL,
	"computed_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "unit_hours_unit_id_hour_start_pk" PRIMARY KEY("unit_id","hour_start")
) PARTITION BY RANGE ("hour_start");
--> statement-breakpoint
ALTER TABLE "unit_hours" ADD CONSTRAINT "unit_hours_unit_id_plant_units_id_fk" FOREIGN KEY ("unit_id") REFERENCES "public"."plant_units"("id") ON DELETE cascade ON UPDATE no action;
--> statement-breakpoint
SELECT lossline_month_partitions('unit_hours', (SELECT min(hour_start) FROM unit_hours_before_scale), (SELECT max(hour_start) FROM unit_hours_before_scale));
--> statement-breakpoint
INSERT INTO "unit_hours" SELECT * FROM "unit_hours_before_scale";
--> statement-breakpoint
DROP TABLE "unit_hours_before_scale";
