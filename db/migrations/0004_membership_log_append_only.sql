-- Membership changes are an audit trail: append-only, like review decisions.
CREATE TRIGGER membership_log_append_only BEFORE UPDATE OR DELETE ON membership_log
  FOR EACH ROW EXECUTE FUNCTION ecotone_refuse_change();
