CREATE TABLE "review_notices" (
	"review_id" bigint PRIMARY KEY NOT NULL,
	"volunteer_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"digest_id" bigint
);
--> statement-breakpoint
ALTER TABLE "review_notices" ADD CONSTRAINT "review_notices_review_id_reviews_id_fk" FOREIGN KEY ("review_id") REFERENCES "public"."reviews"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_notices" ADD CONSTRAINT "review_notices_volunteer_id_users_id_fk" FOREIGN KEY ("volunteer_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "review_notices" ADD CONSTRAINT "review_notices_digest_id_email_outbox_id_fk" FOREIGN KEY ("digest_id") REFERENCES "public"."email_outbox"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "review_notices_waiting_idx" ON "review_notices" USING btree ("volunteer_id","created_at") WHERE "review_notices"."digest_id" IS NULL;--> statement-breakpoint
CREATE INDEX "sightings_queue_observed_idx" ON "sightings" USING btree ("event_id","review_state","observed_at","id");--> statement-breakpoint
CREATE INDEX "sightings_queue_all_observed_idx" ON "sightings" USING btree ("event_id","observed_at","id");--> statement-breakpoint
CREATE INDEX "sightings_duplicate_idx" ON "sightings" USING btree ("event_id","user_id","taxon_id","observed_at");