-- Every server remembers who its signed-in members are (server/auth/member-directory.ts). Any change to a
-- membership or to a member's name or e-mail tells every server which user to read again, on the
-- channel `member_changed`; the notice is sent when the change commits, and a truncate tells them all.
CREATE OR REPLACE FUNCTION dropwise_membership_changed() RETURNS trigger AS $$
BEGIN
  IF TG_OP = 'DELETE' THEN
    PERFORM pg_notify('member_changed', OLD.user_id);
  ELSE
    PERFORM pg_notify('member_changed', NEW.user_id);
    IF TG_OP = 'UPDATE' AND OLD.user_id IS DISTINCT FROM NEW.user_id THEN
      PERFORM pg_notify('member_changed', OLD.user_id);
    END IF;
  END IF;
  RETURN NULL;
END
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE OR REPLACE FUNCTION dropwise_member_user_changed() RETURNS trigger AS $$
BEGIN
  PERFORM pg_notify('member_changed', OLD.id);
  RETURN NULL;
END
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE OR REPLACE FUNCTION dropwise_all_members_changed() RETURNS trigger AS $$
BEGIN
  PERFORM pg_notify('member_changed', '*');
  RETURN NULL;
END
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE TRIGGER memberships_changed AFTER INSERT OR UPDATE OR DELETE ON memberships FOR EACH ROW EXECUTE FUNCTION dropwise_membership_changed();
--> statement-breakpoint
CREATE TRIGGER member_users_changed AFTER UPDATE OF name, email OR DELETE ON users FOR EACH ROW EXECUTE FUNCTION dropwise_member_user_changed();
--> statement-breakpoint
CREATE TRIGGER memberships_truncated AFTER TRUNCATE ON memberships FOR EACH STATEMENT EXECUTE FUNCTION dropwise_all_members_changed();
--> statement-breakpoint
CREATE TRIGGER member_users_truncated AFTER TRUNCATE ON users FOR EACH STATEMENT EXECUTE FUNCTION dropwise_all_members_changed();
