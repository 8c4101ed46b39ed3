CREATE TYPE "public"."check_mark" AS ENUM('outside_area', 'outside_dates', 'high_count', 'not_on_list', 'sensitive_taxon', 'photo_missing', 'possible_duplicate', 'poor_accuracy');--> statement-breakpoint
CREATE TYPE "public"."event_role" AS ENUM('organiser', 'coordinator', 'volunteer');--> statement-breakpoint
CREATE TYPE "public"."event_status" AS ENUM('draft', 'open', 'closed');--> statement-breakpoint
CREATE TYPE "public"."habitat_kind" AS ENUM('interior', 'edge', 'wetland', 'open_water', 'grassland', 'woodland', 'urban', 'other');--> statement-breakpoint
CREATE TYPE "public"."org_role" AS ENUM('organiser', 'member');--> statement-breakpoint
CREATE TYPE "public"."outbox_status" AS ENUM('queued', 'sending', 'sent', 'failed');--> statement-breakpoint
CREATE TYPE "public"."review_state" AS ENUM('pending', 'approved', 'rejected', 'returned');--> statement-breakpoint
CREATE TYPE "public"."sensitivity" AS ENUM('open', 'generalised', 'restricted');--> statement-breakpoint
CREATE TYPE "public"."session_kind" AS ENUM('timed_count', 'walk', 'plot_search');--> statement-breakpoint
CREATE TYPE "public"."taxon_group" AS ENUM('birds', 'vascular_plants', 'insects', 'fungi', 'mammals', 'amphibians_reptiles', 'molluscs', 'other');--> statement-breakpoint
CREATE TYPE "public"."taxon_rank" AS ENUM('family', 'genus', 'species', 'subspecies', 'variety', 'form');--> statement-breakpoint
CREATE TABLE "accounts" (
	"user_id" uuid NOT NULL,
	"type" text NOT NULL,
	"provider" text NOT NULL,
	"provider_account_id" text NOT NULL,
	"refresh_token" text,
	"access_token" text,
	"expires_at" integer,
	"token_type" text,
	"scope" text,
	"id_token" text,
	"session_state" text,
	CONSTRAINT "accounts_provider_provider_account_id_pk" PRIMARY KEY("provider","provider_account_id")
);
--> statement-breakpoint
CREATE TABLE "count_sessions" (
	"id" uuid PRIMARY KEY NOT NULL,
	"event_id" uuid NOT NULL,
	"user_id" uuid NOT NULL,
	"zone_id" uuid,
	"kind" "session_kind" NOT NULL,
	"started_at" timestamp with time zone NOT NULL,
	"ended_at" timestamp with time zone,
	"all_species_noted" boolean DEFAULT false NOT NULL,
	"distance_m" real,
	"notes" text DEFAULT '' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "count_sessions_ends_after_starts" CHECK ("count_sessions"."ended_at" IS NULL OR "count_sessions"."ended_at" > "count_sessions"."started_at"),
	CONSTRAINT "count_sessions_distance_nonneg" CHECK ("count_sessions"."distance_m" IS NULL OR "count_sessions"."distance_m" >= 0),
	CONSTRAINT "count_sessions_complete_needs_end" CHECK (NOT "count_sessions"."all_species_noted" OR "count_sessions"."ended_at" IS NOT NULL)
);
--> statement-breakpoint
CREATE TABLE "email_outbox" (
	"id" bigserial PRIMARY KEY NOT NULL,
	"to_address" text NOT NULL,
	"kind" varchar(40) NOT NULL,
	"locale" varchar(8) DEFAULT 'en' NOT NULL,
	"subject" text NOT NULL,
	"text_body" text NOT NULL,
	"html_body" text,
	"status" "outbox_status" DEFAULT 'queued' NOT NULL,
	"attempts" smallint DEFAULT 0 NOT NULL,
	"last_error" text,
	"send_after" timestamp with time zone DEFAULT now() NOT NULL,
	"sent_at" timestamp with time zone,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL
);
--> statement-breakpoint
CREATE TABLE "event_members" (
	"event_id" uuid NOT NULL,
	"user_id" uuid NOT NULL,
	"role" "event_role" NOT NULL,
	"taxon_groups" "taxon_group"[] DEFAULT ARRAY[]::taxon_group[] NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "event_members_event_id_user_id_pk" PRIMARY KEY("event_id","user_id")
);
--> statement-breakpoint
CREATE TABLE "event_species" (
	"event_id" uuid NOT NULL,
	"taxon_id" uuid NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "event_species_event_id_taxon_id_pk" PRIMARY KEY("event_id","taxon_id")
);
--> statement-breakpoint
CREATE TABLE "events" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"organisation_id" uuid NOT NULL,
	"slug" varchar(80) NOT NULL,
	"name" text NOT NULL,
	"description" text DEFAULT '' NOT NULL,
	"status" "event_status" DEFAULT 'draft' NOT NULL,
	"starts_at" timestamp with time zone NOT NULL,
	"ends_at" timestamp with time zone NOT NULL,
	"time_zone" text NOT NULL,
	"languages" text[] DEFAULT ARRAY['en']::text[] NOT NULL,
	"area" geometry(Polygon,4326),
	"session_kinds" "session_kind"[] DEFAULT ARRAY['timed_count','walk','plot_search']::session_kind[] NOT NULL,
	"photo_required_sensitive" boolean DEFAULT true NOT NULL,
	"photo_required_off_list" boolean DEFAULT true NOT NULL,
	"accuracy_limit_m" integer DEFAULT 100 NOT NULL,
	"join_code" varchar(32),
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "events_slug_unique" UNIQUE("slug"),
	CONSTRAINT "events_join_code_unique" UNIQUE("join_code"),
	CONSTRAINT "events_ends_after_starts" CHECK ("events"."ends_at" > "events"."starts_at"),
	CONSTRAINT "events_slug_shape" CHECK ("events"."slug" ~ '^[a-z0-9]+(-[a-z0-9]+)*$'),
	CONSTRAINT "events_accuracy_limit_positive" CHECK ("events"."accuracy_limit_m" > 0),
	CONSTRAINT "events_languages_nonempty" CHECK (cardinality("events"."languages") > 0),
	CONSTRAINT "events_area_valid" CHECK ("events"."area" IS NULL OR ST_IsValid("events"."area"))
);
--> statement-breakpoint
CREATE TABLE "organisation_members" (
	"organisation_id" uuid NOT NULL,
	"user_id" uuid NOT NULL,
	"role" "org_role" NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "organisation_members_organisation_id_user_id_pk" PRIMARY KEY("organisation_id","user_id")
);
--> statement-breakpoint
CREATE TABLE "organisations" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"slug" varchar(80) NOT NULL,
	"name" text NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "organisations_slug_unique" UNIQUE("slug"),
	CONSTRAINT "organisations_slug_shape" CHECK ("organisations"."slug" ~ '^[a-z0-9]+(-[a-z0-9]+)*$')
);
--> statement-breakpoint
CREATE TABLE "photos" (
	"id" uuid PRIMARY KEY NOT NULL,
	"sighting_id" uuid NOT NULL,
	"storage_key" text NOT NULL,
	"content_type" varchar(40) NOT NULL,
	"size_bytes" integer NOT NULL,
	"sha256" varchar(64) NOT NULL,
	"width" integer,
	"height" integer,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "photos_storage_key_unique" UNIQUE("storage_key"),
	CONSTRAINT "photos_type" CHECK ("photos"."content_type" IN ('image/jpeg', 'image/png', 'image/webp')),
	CONSTRAINT "photos_size" CHECK ("photos"."size_bytes" > 0 AND "photos"."size_bytes" <= 20000000),
	CONSTRAINT "photos_sha256_hex" CHECK ("photos"."sha256" ~ '^[0-9a-f]{64}$')
);
--> statement-breakpoint
CREATE TABLE "reports" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"event_id" uuid NOT NULL,
	"version" integer NOT NULL,
	"published_at" timestamp with time zone DEFAULT now() NOT NULL,
	"published_by" uuid NOT NULL,
	"engine_version" text NOT NULL,
	"input_hash" varchar(64) NOT NULL,
	"input_records" jsonb NOT NULL,
	"results" jsonb NOT NULL,
	"method_notes" jsonb NOT NULL,
	"changes" jsonb DEFAULT '[]'::jsonb NOT NULL,
	CONSTRAINT "reports_version_positive" CHECK ("reports"."version" >= 1),
	CONSTRAINT "reports_hash_hex" CHECK ("reports"."input_hash" ~ '^[0-9a-f]{64}$')
);
--> statement-breakpoint
CREATE TABLE "reviews" (
	"id" bigserial PRIMARY KEY NOT NULL,
	"sighting_id" uuid NOT NULL,
	"reviewer_id" uuid NOT NULL,
	"decided_at" timestamp with time zone DEFAULT now() NOT NULL,
	"from_state" "review_state" NOT NULL,
	"to_state" "review_state" NOT NULL,
	"from_taxon_id" uuid,
	"to_taxon_id" uuid,
	"reason" text DEFAULT '' NOT NULL,
	"message" text DEFAULT '' NOT NULL
);
--> statement-breakpoint
CREATE TABLE "sessions" (
	"session_token" text PRIMARY KEY NOT NULL,
	"user_id" uuid NOT NULL,
	"expires" timestamp with time zone NOT NULL
);
--> statement-breakpoint
CREATE TABLE "sightings" (
	"id" uuid PRIMARY KEY NOT NULL,
	"event_id" uuid NOT NULL,
	"user_id" uuid NOT NULL,
	"session_id" uuid,
	"taxon_id" uuid,
	"description" text DEFAULT '' NOT NULL,
	"count" integer NOT NULL,
	"count_is_estimate" boolean DEFAULT false NOT NULL,
	"observed_at" timestamp with time zone NOT NULL,
	"location" geometry(Point,4326) NOT NULL,
	"accuracy_m" real NOT NULL,
	"zone_id" uuid,
	"notes" text DEFAULT '' NOT NULL,
	"review_state" "review_state" DEFAULT 'pending' NOT NULL,
	"version" integer DEFAULT 1 NOT NULL,
	"check_marks" "check_mark"[] DEFAULT ARRAY[]::check_mark[] NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	"updated_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "sightings_count_positive" CHECK ("sightings"."count" >= 1),
	CONSTRAINT "sightings_accuracy_nonneg" CHECK ("sightings"."accuracy_m" >= 0),
	CONSTRAINT "sightings_location_wgs84" CHECK (ST_X("sightings"."location") BETWEEN -180 AND 180 AND ST_Y("sightings"."location") BETWEEN -90 AND 90),
	CONSTRAINT "sightings_identified_or_described" CHECK ("sightings"."taxon_id" IS NOT NULL OR length(btrim("sightings"."description")) > 0)
);
--> statement-breakpoint
CREATE TABLE "taxa" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"scientific_name" text NOT NULL,
	"rank" "taxon_rank" DEFAULT 'species' NOT NULL,
	"taxon_group" "taxon_group" NOT NULL,
	"sensitivity" "sensitivity" DEFAULT 'open' NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "taxa_scientific_name_nonempty" CHECK (length(btrim("taxa"."scientific_name")) > 0)
);
--> statement-breakpoint
CREATE TABLE "taxon_names" (
	"taxon_id" uuid NOT NULL,
	"locale" varchar(8) NOT NULL,
	"name" text NOT NULL,
	CONSTRAINT "taxon_names_taxon_id_locale_pk" PRIMARY KEY("taxon_id","locale"),
	CONSTRAINT "taxon_names_nonempty" CHECK (length(btrim("taxon_names"."name")) > 0)
);
--> statement-breakpoint
CREATE TABLE "users" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"name" text,
	"email" text NOT NULL,
	"email_verified" timestamp with time zone,
	"image" text,
	"password_hash" text,
	"locale" varchar(8) DEFAULT 'en' NOT NULL,
	"is_admin" boolean DEFAULT false NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "users_email_shape" CHECK ("users"."email" ~ '^[^@\s]+@[^@\s]+$')
);
--> statement-breakpoint
CREATE TABLE "verification_tokens" (
	"identifier" text NOT NULL,
	"token" text NOT NULL,
	"expires" timestamp with time zone NOT NULL,
	CONSTRAINT "verification_tokens_identifier_token_pk" PRIMARY KEY("identifier","token")
);
--> statement-breakpoint
CREATE TABLE "zones" (
	"id" uuid PRIMARY KEY DEFAULT gen_random_uuid() NOT NULL,
	"event_id" uuid NOT NULL,
	"name" text NOT NULL,
	"habitat" "habitat_kind" NOT NULL,
	"description" text DEFAULT '' NOT NULL,
	"geom" geometry(Polygon,4326) NOT NULL,
	"created_at" timestamp with time zone DEFAULT now() NOT NULL,
	CONSTRAINT "zones_geom_valid" CHECK (ST_IsValid("zones"."geom"))
);
--> statement-breakpoint
ALTER TABLE "accounts" ADD CONSTRAINT "accounts_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "count_sessions" ADD CONSTRAINT "count_sessions_event_id_events_id_fk" FOREIGN KEY ("event_id") REFERENCES "public"."events"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "count_sessions" ADD CONSTRAINT "count_sessions_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "count_sessions" ADD CONSTRAINT "count_sessions_zone_id_zones_id_fk" FOREIGN KEY ("zone_id") REFERENCES "public"."zones"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "event_members" ADD CONSTRAINT "event_members_event_id_events_id_fk" FOREIGN KEY ("event_id") REFERENCES "public"."events"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "event_members" ADD CONSTRAINT "event_members_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "event_species" ADD CONSTRAINT "event_species_event_id_events_id_fk" FOREIGN KEY ("event_id") REFERENCES "public"."events"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "event_species" ADD CONSTRAINT "event_species_taxon_id_taxa_id_fk" FOREIGN KEY ("taxon_id") REFERENCES "public"."taxa"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "events" ADD CONSTRAINT "events_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "organisation_members" ADD CONSTRAINT "organisation_members_organisation_id_organisations_id_fk" FOREIGN KEY ("organisation_id") REFERENCES "public"."organisations"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "organisation_members" ADD CONSTRAINT "organisation_members_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "photos" ADD CONSTRAINT "photos_sighting_id_sightings_id_fk" FOREIGN KEY ("sighting_id") REFERENCES "public"."sightings"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reports" ADD CONSTRAINT "reports_event_id_events_id_fk" FOREIGN KEY ("event_id") REFERENCES "public"."events"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reports" ADD CONSTRAINT "reports_published_by_users_id_fk" FOREIGN KEY ("published_by") REFERENCES "public"."users"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reviews" ADD CONSTRAINT "reviews_sighting_id_sightings_id_fk" FOREIGN KEY ("sighting_id") REFERENCES "public"."sightings"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reviews" ADD CONSTRAINT "reviews_reviewer_id_users_id_fk" FOREIGN KEY ("reviewer_id") REFERENCES "public"."users"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reviews" ADD CONSTRAINT "reviews_from_taxon_id_taxa_id_fk" FOREIGN KEY ("from_taxon_id") REFERENCES "public"."taxa"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "reviews" ADD CONSTRAINT "reviews_to_taxon_id_taxa_id_fk" FOREIGN KEY ("to_taxon_id") REFERENCES "public"."taxa"("id") ON DELETE no action ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "sessions" ADD CONSTRAINT "sessions_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "sightings" ADD CONSTRAINT "sightings_event_id_events_id_fk" FOREIGN KEY ("event_id") REFERENCES "public"."events"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "sightings" ADD CONSTRAINT "sightings_user_id_users_id_fk" FOREIGN KEY ("user_id") REFERENCES "public"."users"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "sightings" ADD CONSTRAINT "sightings_session_id_count_sessions_id_fk" FOREIGN KEY ("session_id") REFERENCES "public"."count_sessions"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "sightings" ADD CONSTRAINT "sightings_taxon_id_taxa_id_fk" FOREIGN KEY ("taxon_id") REFERENCES "public"."taxa"("id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "sightings" ADD CONSTRAINT "sightings_zone_id_zones_id_fk" FOREIGN KEY ("zone_id") REFERENCES "public"."zones"("id") ON DELETE set null ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "taxon_names" ADD CONSTRAINT "taxon_names_taxon_id_taxa_id_fk" FOREIGN KEY ("taxon_id") REFERENCES "public"."taxa"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
ALTER TABLE "zones" ADD CONSTRAINT "zones_event_id_events_id_fk" FOREIGN KEY ("event_id") REFERENCES "public"."events"("id") ON DELETE cascade ON UPDATE no action;--> statement-breakpoint
CREATE INDEX "accounts_user_idx" ON "accounts" USING btree ("user_id");--> statement-breakpoint
CREATE INDEX "count_sessions_event_idx" ON "count_sessions" USING btree ("event_id","zone_id");--> statement-breakpoint
CREATE INDEX "count_sessions_user_idx" ON "count_sessions" USING btree ("user_id");--> statement-breakpoint
CREATE INDEX "email_outbox_due_idx" ON "email_outbox" USING btree ("status","send_after");--> statement-breakpoint
CREATE INDEX "event_members_user_idx" ON "event_members" USING btree ("user_id");--> statement-breakpoint
CREATE INDEX "events_organisation_idx" ON "events" USING btree ("organisation_id");--> statement-breakpoint
CREATE INDEX "events_area_gist" ON "events" USING gist ("area");--> statement-breakpoint
CREATE INDEX "organisation_members_user_idx" ON "organisation_members" USING btree ("user_id");--> statement-breakpoint
CREATE INDEX "photos_sighting_idx" ON "photos" USING btree ("sighting_id");--> statement-breakpoint
CREATE UNIQUE INDEX "reports_event_version_key" ON "reports" USING btree ("event_id","version");--> statement-breakpoint
CREATE INDEX "reviews_sighting_idx" ON "reviews" USING btree ("sighting_id","decided_at");--> statement-breakpoint
CREATE INDEX "sessions_user_idx" ON "sessions" USING btree ("user_id");--> statement-breakpoint
CREATE INDEX "sightings_queue_idx" ON "sightings" USING btree ("event_id","review_state","created_at","id");--> statement-breakpoint
CREATE INDEX "sightings_results_idx" ON "sightings" USING btree ("event_id","review_state","taxon_id");--> statement-breakpoint
CREATE INDEX "sightings_session_idx" ON "sightings" USING btree ("session_id");--> statement-breakpoint
CREATE INDEX "sightings_user_idx" ON "sightings" USING btree ("user_id","observed_at");--> statement-breakpoint
CREATE INDEX "sightings_location_gist" ON "sightings" USING gist ("location");--> statement-breakpoint
CREATE UNIQUE INDEX "taxa_scientific_name_key" ON "taxa" USING btree (lower("scientific_name"));--> statement-breakpoint
CREATE UNIQUE INDEX "users_email_lower_key" ON "users" USING btree (lower("email"));--> statement-breakpoint
CREATE UNIQUE INDEX "zones_event_name_key" ON "zones" USING btree ("event_id","name");--> statement-breakpoint
CREATE INDEX "zones_geom_gist" ON "zones" USING gist ("geom");