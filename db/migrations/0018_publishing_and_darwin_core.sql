CREATE TABLE "report_withdrawals" (
	"report_id" uuid PRIMARY KEY NOT NULL,
	"withdrawn_at" timestamp with time zone DEFAULT now() NOT NULL,
	"withdrawn_by" uuid NOT NULL,
	"reason" text NOT NULL,
	CONSTRAINT "report_withdrawals_reason_nonempty" CHECK (length(btrim("report_withdrawals"."reason")) > 0)
);
--> statement-breakpoint
ALTER TABLE "events" ADD COLUMN "data_license" text DEFAULT 'cc-by-4.0' NOT NULL;--> statement-breakpoint
ALTER TABLE "events" ADD COLUMN "publish_absences" boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE "events" ADD COLUMN "is_demo" boolean DEFAULT false NOT NULL;--> statement-breakpoint
ALTER TABLE "reports" ADD COLUMN "note" text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE "report_withdrawals" ADD CONSTRAINT "report_withdrawals_report_id_reports_id_fk" FOREIGN KEY ("report_id") REFERENCES "public"."reports"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "report_withdrawals" ADD CONSTRAINT "report_withdrawals_withdrawn_by_users_id_fk" FOREIGN KEY ("withdrawn_by") REFERENCES "public"."users"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "events" ADD CONSTRAINT "events_data_license_kind" CHECK ("events"."data_license" IN ('cc0-1.0', 'cc-by-4.0', 'cc-by-nc-4.0'));--> statement-breakpoint
CREATE TRIGGER report_withdrawals_append_only BEFORE UPDATE OR DELETE ON report_withdrawals
  FOR EACH ROW EXECUTE FUNCTION ecotone_refuse_change();--> statement-breakpoint
CREATE TRIGGER report_withdrawals_no_truncate BEFORE TRUNCATE ON report_withdrawals
  FOR EACH STATEMENT EXECUTE FUNCTION ecotone_refuse_change();
