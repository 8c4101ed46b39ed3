CREATE TYPE "public"."admin_action" AS ENUM('account_locked', 'account_unlocked', 'sessions_ended', 'mail_retried');--> statement-breakpoint
CREATE TYPE "public"."organisation_log_action" AS ENUM('requested', 'approved', 'declined', 'organiser_added', 'organiser_removed', 'suspended', 'reinstated');--> statement-breakpoint
CREATE TYPE "public"."organisation_request_state" AS ENUM('pending', 'approved', 'declined');--> statement-breakpoint
CREATE TYPE "public"."sighting_source" AS ENUM('phone', 'paper_sheet');--> statement-breakpoint
CREATE TABLE "admin_log" (
	"id" bigserial PRIMARY KEY NOT NULL,
	"actor_id" uuid NOT NULL,
	"action" "admin_action" NOT NULL,
	"subject_user_id" uuid,
	"subject_email" text,
	"mail_id" bigint,
	"reason" text DEFAULT '' NOT NULL,
	"at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "organisation_log" (
	"id" bigserial PRIMARY KEY NOT NULL,
	"organisation_id" uuid,
	"request_id" uuid,
	"action" "organisation_log_action" NOT NULL,
	"actor_id" uuid,
	"subject_user_id" uuid,
	"subject_email" text,
	"reason" text DEFAULT '' NOT NULL,
	"at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "organisation_requests" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"requested_by" uuid NOT NULL,
	"name" text NOT NULL,
	"contact_email" text NOT NULL,
	"country" varchar(2) NOT NULL,
	"description" text NOT NULL,
	"state" "organisation_request_state" DEFAULT 'pending' NOT NULL,
	"decided_by" uuid,
	"decided_at" timestamp with time zone,
	"reason" text DEFAULT '' NOT NULL,
	"organisation_id" uuid,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "organisation_requests_country_shape" CHECK ("organisation_requests"."country" ~ '^[A-Z]{2}$')
);
--> statement-breakpoint
CREATE TABLE "worker_runs" (
	"worker" varchar(40) PRIMARY KEY NOT NULL,
	"last_run_at" timestamp with time zone NOT NULL,
	"summary" text DEFAULT '' NOT NULL,
	"last_error" text
);
--> statement-breakpoint
ALTER TABLE "organisations" ADD COLUMN "contact_email" text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE "organisations" ADD COLUMN "country" varchar(2);--> statement-breakpoint
ALTER TABLE "organisations" ADD COLUMN "description" text DEFAULT '' NOT NULL;--> statement-breakpoint
ALTER TABLE "organisations" ADD COLUMN "suspended_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "sightings" ADD COLUMN "source" "sighting_source" DEFAULT 'phone' NOT NULL;--> statement-breakpoint
ALTER TABLE "sightings" ADD COLUMN "transcribed_by" uuid;--> statement-breakpoint
ALTER TABLE "users" ADD COLUMN "locked_at" timestamp with time zone;--> statement-breakpoint
ALTER TABLE "organisation_log" ADD CONSTRAINT "organisation_log_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "organisation_log" ADD CONSTRAINT "organisation_log_request_id_organisation_requests_id_fk" FOREIGN KEY ("request_id") REFERENCES "public"."organisation_requests"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "organisation_requests" ADD CONSTRAINT "organisation_requests_requested_by_users_id_fk" FOREIGN KEY ("requested_by") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "organisation_requests" ADD CONSTRAINT "organisation_requests_decided_by_users_id_fk" FOREIGN KEY ("decided_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "organisation_requests" ADD CONSTRAINT "organisation_requests_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "admin_log_at_idx" ON "admin_log" USING btree ("at");--> statement-breakpoint
CREATE INDEX "organisation_log_org_idx" ON "organisation_log" USING btree ("organisation_id","at");--> statement-breakpoint
CREATE INDEX "organisation_log_at_idx" ON "organisation_log" USING btree ("at");--> statement-breakpoint
CREATE INDEX "organisation_requests_state_idx" ON "organisation_requests" USING btree ("state","created_at");--> statement-breakpoint
CREATE INDEX "organisation_requests_user_idx" ON "organisation_requests" USING btree ("requested_by");--> statement-breakpoint
ALTER TABLE "sightings" ADD CONSTRAINT "sightings_transcribed_by_users_id_fk" FOREIGN KEY ("transcribed_by") REFERENCES "public"."users"("id") ON DELETE set null ON UPDATE no action;