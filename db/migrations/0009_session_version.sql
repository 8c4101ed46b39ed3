ALTER TABLE "users" ADD COLUMN "session_version" integer DEFAULT 0 NOT NULL;
