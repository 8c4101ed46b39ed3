ALTER TABLE "users" ADD COLUMN "published_name" text;--> statement-breakpoint
ALTER TABLE "users" ADD COLUMN "publish_consent_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "users" ADD COLUMN "erased_at" timestamp with time zone;--> statement-breakpoint
-- Erasing an account (db/queries/erasure.ts) keeps the membership log append-only: no row is
-- ever deleted and no fact in it changes. The one change allowed is redaction: the subject's
-- e-mail replaced by the erased person's tombstone address (users row with erased_at set),
-- every other column as it was. A row logged before the person had an account (no subject id)
-- is matched by the erased address, given by the erasing transaction in ecotone.erased_email.
CREATE OR REPLACE FUNCTION ecotone_membership_log_guard() RETURNS trigger
LANGUAGE plpgsql AS $$
BEGIN
  IF TG_OP = 'UPDATE'
     AND (NEW.id, NEW.event_id, NEW.actor_id, NEW.action, NEW.from_role, NEW.to_role, NEW.taxon_groups, NEW.at)
         IS NOT DISTINCT FROM (OLD.id, OLD.event_id, OLD.actor_id, OLD.action, OLD.from_role, OLD.to_role, OLD.taxon_groups, OLD.at)
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
DROP TRIGGER membership_log_append_only ON membership_log;
--> statement-breakpoint
CREATE TRIGGER membership_log_append_only BEFORE UPDATE OR DELETE ON membership_log
  FOR EACH ROW EXECUTE FUNCTION ecotone_membership_log_guard();
