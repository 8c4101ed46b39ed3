CREATE TABLE "worker_runs" (
	"worker" varchar(40) PRIMARY KEY NOT NULL,
	"last_run_at" timestamp with time zone NOT NULL,
	"summary" text DEFAULT '' NOT NULL,
	"last_error" text
);
