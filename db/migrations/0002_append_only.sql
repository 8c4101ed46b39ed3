-- A coordinator's decision is never erased and a published report never changes
-- (design.md, "Flows that must never lose data"): enforce it in the database itself.
CREATE OR REPLACE FUNCTION ecotone_refuse_change() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
  RAISE EXCEPTION '% rows are append-only: % refused', TG_TABLE_NAME, TG_OP
    USING ERRCODE = 'integrity_constraint_violation';
END;
$$;
--> statement-breakpoint
CREATE TRIGGER reviews_append_only BEFORE UPDATE OR DELETE ON reviews
  FOR EACH ROW EXECUTE FUNCTION ecotone_refuse_change();
--> statement-breakpoint
CREATE TRIGGER reviews_no_truncate BEFORE TRUNCATE ON reviews
  FOR EACH STATEMENT EXECUTE FUNCTION ecotone_refuse_change();
--> statement-breakpoint
CREATE TRIGGER reports_append_only BEFORE UPDATE OR DELETE ON reports
  FOR EACH ROW EXECUTE FUNCTION ecotone_refuse_change();
--> statement-breakpoint
CREATE TRIGGER reports_no_truncate BEFORE TRUNCATE ON reports
  FOR EACH STATEMENT EXECUTE FUNCTION ecotone_refuse_change();
