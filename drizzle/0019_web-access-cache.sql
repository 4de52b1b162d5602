-- More of what the web process keeps in memory (src/server/hours-cache.ts), each emptied by a NOTIFY
-- at the commit of a change. The read cache's channel now also hears sites, baselines and drift
-- notices (a unit's active baseline, a trend's whole answer, the overview's notice counts). A new
-- channel, lossline_access_changed, hears people, sessions and site lists: the guard keeps each
-- session cookie's person and sites (src/server/session-lookup.ts) until one of these changes, so a
-- deactivation (the admin plugin's ban updates the person and deletes their sessions) takes effect
-- at its commit. A new session (sign-in) changes nothing kept and sends nothing.
CREATE OR REPLACE FUNCTION lossline_notify_access_changed() RETURNS trigger AS $$
BEGIN
  PERFORM pg_notify('lossline_access_changed', TG_TABLE_NAME);
  RETURN NULL;
END $$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE TRIGGER user_access_changed AFTER UPDATE OR DELETE OR TRUNCATE ON "user"
  FOR EACH STATEMENT EXECUTE FUNCTION lossline_notify_access_changed();
--> statement-breakpoint
CREATE TRIGGER session_access_changed AFTER UPDATE OR DELETE OR TRUNCATE ON session
  FOR EACH STATEMENT EXECUTE FUNCTION lossline_notify_access_changed();
--> statement-breakpoint
CREATE TRIGGER person_sites_access_changed AFTER INSERT OR UPDATE OR DELETE OR TRUNCATE ON person_sites
  FOR EACH STATEMENT EXECUTE FUNCTION lossline_notify_access_changed();
--> statement-breakpoint
CREATE TRIGGER sites_changed AFTER INSERT OR UPDATE OR DELETE OR TRUNCATE ON sites
  FOR EACH STATEMENT EXECUTE FUNCTION lossline_notify_hours_changed();
--> statement-breakpoint
CREATE TRIGGER baselines_changed AFTER INSERT OR UPDATE OR DELETE OR TRUNCATE ON baselines
  FOR EACH STATEMENT EXECUTE FUNCTION lossline_notify_hours_changed();
--> statement-breakpoint
CREATE TRIGGER drift_notices_changed AFTER INSERT OR UPDATE OR DELETE OR TRUNCATE ON drift_notices
  FOR EACH STATEMENT EXECUTE FUNCTION lossline_notify_hours_changed();
