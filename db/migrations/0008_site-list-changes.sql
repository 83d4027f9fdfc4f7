-- Every server remembers each team's site list (server/services/site-lists.ts). Any change to a site, or to
-- who is assigned to it, tells every server which team's list to read again, on the channel
-- `site_list_changed`; the notice is sent when the change commits (Postgres sends one notice per team and
-- transaction however many rows changed), and a truncate tells them every list.
CREATE OR REPLACE FUNCTION dropwise_site_changed() RETURNS trigger AS $$
BEGIN
  IF TG_OP = 'DELETE' THEN
    PERFORM pg_notify('site_list_changed', OLD.team_id);
  ELSE
    PERFORM pg_notify('site_list_changed', NEW.team_id);
    IF TG_OP = 'UPDATE' AND OLD.team_id IS DISTINCT FROM NEW.team_id THEN
      PERFORM pg_notify('site_list_changed', OLD.team_id);
    END IF;
  END IF;
  RETURN NULL;
END
$$ LANGUAGE plpgsql;
--> statement-breakpoint
-- An assignment names its site: the notice names the site's team. When the site itself is gone (deleted in
-- the same statement, the assignment following by cascade) the site's own trigger has named the team.
CREATE OR REPLACE FUNCTION dropwise_site_assignment_changed() RETURNS trigger AS $$
DECLARE
  team text;
BEGIN
  IF TG_OP <> 'INSERT' THEN
    SELECT team_id INTO team FROM sites WHERE id = OLD.site_id;
    IF team IS NOT NULL THEN
      PERFORM pg_notify('site_list_changed', team);
    END IF;
  END IF;
  IF TG_OP <> 'DELETE' THEN
    SELECT team_id INTO team FROM sites WHERE id = NEW.site_id;
    IF team IS NOT NULL THEN
      PERFORM pg_notify('site_list_changed', team);
    END IF;
  END IF;
  RETURN NULL;
END
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE OR REPLACE FUNCTION dropwise_all_site_lists_changed() RETURNS trigger AS $$
BEGIN
  PERFORM pg_notify('site_list_changed', '*');
  RETURN NULL;
END
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE TRIGGER sites_changed AFTER INSERT OR UPDATE OR DELETE ON sites FOR EACH ROW EXECUTE FUNCTION dropwise_site_changed();
--> statement-breakpoint
CREATE TRIGGER site_assignments_changed AFTER INSERT OR UPDATE OR DELETE ON site_assignments FOR EACH ROW EXECUTE FUNCTION dropwise_site_assignment_changed();
--> statement-breakpoint
CREATE TRIGGER sites_truncated AFTER TRUNCATE ON sites FOR EACH STATEMENT EXECUTE FUNCTION dropwise_all_site_lists_changed();
--> statement-breakpoint
CREATE TRIGGER site_assignments_truncated AFTER TRUNCATE ON site_assignments FOR EACH STATEMENT EXECUTE FUNCTION dropwise_all_site_lists_changed();
