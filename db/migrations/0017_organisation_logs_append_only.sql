-- The organisation log and the admin log are audit trails: append-only, like review decisions.
CREATE TRIGGER organisation_log_append_only BEFORE UPDATE OR DELETE ON organisation_log
  FOR EACH ROW EXECUTE FUNCTION ecotone_refuse_change();
--> statement-breakpoint
CREATE TRIGGER organisation_log_no_truncate BEFORE TRUNCATE ON organisation_log
  FOR EACH STATEMENT EXECUTE FUNCTION ecotone_refuse_change();
--> statement-breakpoint
CREATE TRIGGER admin_log_append_only BEFORE UPDATE OR DELETE ON admin_log
  FOR EACH ROW EXECUTE FUNCTION ecotone_refuse_change();
--> statement-breakpoint
CREATE TRIGGER admin_log_no_truncate BEFORE TRUNCATE ON admin_log
  FOR EACH STATEMENT EXECUTE FUNCTION ecotone_refuse_change();
