-- The web process keeps figures read from unit hours in memory (src/server/hours-cache.ts) and learns
-- of every change through NOTIFY, sent at the commit of any statement that writes unit_hours (the
-- engine, retention, a unit removed) or plant_units. One notification per transaction: PostgreSQL
-- folds repeats of the same channel and payload, so a job writing many batches sends one.
CREATE OR REPLACE FUNCTION lossline_notify_hours_changed() RETURNS trigger AS $$
BEGIN
  PERFORM pg_notify('lossline_hours_changed', TG_TABLE_NAME);
  RETURN NULL;
END $$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE TRIGGER unit_hours_changed AFTER INSERT OR UPDATE OR DELETE OR TRUNCATE ON unit_hours
  FOR EACH STATEMENT EXECUTE FUNCTION lossline_notify_hours_changed();
--> statement-breakpoint
CREATE TRIGGER plant_units_changed AFTER INSERT OR UPDATE OR DELETE OR TRUNCATE ON plant_units
  FOR EACH STATEMENT EXECUTE FUNCTION lossline_notify_hours_changed();
