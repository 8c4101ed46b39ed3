ALTER TYPE "public"."admin_action" ADD VALUE 'account_erased';--> statement-breakpoint
-- A site admin erases an account by the same rule as a person's own erasure (db/queries/my-data.ts
-- eraseAccount). The organisation log and the admin log hold people's addresses too; they stay
-- append-only, and the one change allowed is the redaction the membership log already allows
-- (migration 0012): the subject's address replaced by the erased person's tombstone address,
-- every other column as it was.
CREATE OR REPLACE FUNCTION ecotone_subject_redaction_guard() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
  IF TG_OP = 'UPDATE'
     AND (to_jsonb(NEW) - 'subject_email' - 'subject_user_id') = (to_jsonb(OLD) - 'subject_email' - 'subject_user_id')
     AND NEW.subject_user_id IS NOT NULL
     AND (OLD.subject_user_id = NEW.subject_user_id
          OR (OLD.subject_user_id IS NULL
              AND lower(OLD.subject_email) = current_setting('ecotone.erased_email', true)))
     AND EXISTS (SELECT 1 FROM users u
                 WHERE u.id = NEW.subject_user_id AND u.erased_at IS NOT NULL AND u.email = NEW.subject_email)
  THEN
    RETURN NEW;
  END IF;
  RAISE EXCEPTION '% rows are append-only: % refused', TG_TABLE_NAME, TG_OP
    USING ERRCODE = 'integrity_constraint_violation';
END;
$$;
--> statement-breakpoint
DROP TRIGGER organisation_log_append_only ON organisation_log;
--> statement-breakpoint
CREATE TRIGGER organisation_log_append_only BEFORE UPDATE OR DELETE ON organisation_log
  FOR EACH ROW EXECUTE FUNCTION ecotone_subject_redaction_guard();
--> statement-breakpoint
DROP TRIGGER admin_log_append_only ON admin_log;
--> statement-breakpoint
CREATE TRIGGER admin_log_append_only BEFORE UPDATE OR DELETE ON admin_log
  FOR EACH ROW EXECUTE FUNCTION ecotone_subject_redaction_guard();
