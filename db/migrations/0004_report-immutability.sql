-- A published report version and a sign-off are evidence: they are never changed or deleted.
CREATE OR REPLACE FUNCTION dropwise_refuse_change() RETURNS trigger AS $$
BEGIN
  RAISE EXCEPTION 'rows of % cannot be changed or deleted', TG_TABLE_NAME USING ERRCODE = 'integrity_constraint_violation';
END
$$ LANGUAGE plpgsql;
--> statement-breakpoint
CREATE TRIGGER report_versions_frozen BEFORE UPDATE OR DELETE ON report_versions FOR EACH ROW EXECUTE FUNCTION dropwise_refuse_change();
--> statement-breakpoint
CREATE TRIGGER signoffs_frozen BEFORE UPDATE OR DELETE ON signoffs FOR EACH ROW EXECUTE FUNCTION dropwise_refuse_change();
--> statement-breakpoint
CREATE TRIGGER report_versions_no_truncate BEFORE TRUNCATE ON report_versions FOR EACH STATEMENT EXECUTE FUNCTION dropwise_refuse_change();
--> statement-breakpoint
CREATE TRIGGER signoffs_no_truncate BEFORE TRUNCATE ON signoffs FOR EACH STATEMENT EXECUTE FUNCTION dropwise_refuse_change();
