-- The web process also keeps each site's display units in memory (src/server/services/display-units.ts,
-- through src/server/hours-cache.ts): they come from the site (already heard) and the units of its
-- current tag links. A change of tag links now notifies the read cache's channel at its commit too, so
-- the overview's kept site sections and every page's numbers follow a link's new unit at once.
CREATE TRIGGER tag_links_changed AFTER INSERT OR UPDATE OR DELETE OR TRUNCATE ON tag_links
  FOR EACH STATEMENT EXECUTE FUNCTION lossline_notify_hours_changed();
