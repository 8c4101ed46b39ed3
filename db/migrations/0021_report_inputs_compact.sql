CREATE TABLE "report_inputs" (
	"report_id" uuid PRIMARY KEY NOT NULL,
	"record_count" integer NOT NULL,
	"ids" uuid[] NOT NULL,
	"words" text[] NOT NULL,
	"states" integer[] NOT NULL,
	"taxa" integer[] NOT NULL,
	"counts" integer[] NOT NULL,
	"zones" integer[] NOT NULL,
	"sessions" integer[] NOT NULL,
	"session_zones" integer[] NOT NULL,
	CONSTRAINT "report_inputs_lengths" CHECK (cardinality("report_inputs"."ids") = "report_inputs"."record_count" AND cardinality("report_inputs"."states") = "report_inputs"."record_count" AND cardinality("report_inputs"."taxa") = "report_inputs"."record_count" AND cardinality("report_inputs"."counts") = "report_inputs"."record_count" AND cardinality("report_inputs"."zones") = "report_inputs"."record_count" AND cardinality("report_inputs"."sessions") = "report_inputs"."record_count" AND cardinality("report_inputs"."session_zones") = "report_inputs"."record_count")
);
--> statement-breakpoint
-- Every published report's input records move out of its JSON column into report_inputs'
-- columnar form (db/queries/report-inputs.ts): the same records in the same order, so the
-- input hash computed from them (lib/results/records.ts) still matches the one the report
-- carries. Words are numbered here in text order; the app numbers them as first met: either
-- gives back the same records.
WITH rec AS (
  SELECT r.id AS report_id, e.ord, (e.x->>0)::uuid AS sid, e.x->>1 AS state, e.x->>2 AS taxon,
         (e.x->>3)::int AS n, e.x->>4 AS zone, e.x->>5 AS session, e.x->>6 AS session_zone
  FROM reports r CROSS JOIN LATERAL jsonb_array_elements(r.input_records) WITH ORDINALITY AS e(x, ord)
),
word AS (
  SELECT report_id, w, row_number() OVER (PARTITION BY report_id ORDER BY w)::int AS ix
  FROM (
    SELECT report_id, state AS w FROM rec
    UNION SELECT report_id, taxon FROM rec
    UNION SELECT report_id, zone FROM rec
    UNION SELECT report_id, session FROM rec WHERE session IS NOT NULL
    UNION SELECT report_id, session_zone FROM rec WHERE session_zone IS NOT NULL
  ) v
),
words AS (SELECT report_id, array_agg(w ORDER BY ix) AS words FROM word GROUP BY report_id),
packed AS (
  SELECT rec.report_id, count(*)::int AS n, array_agg(rec.sid ORDER BY rec.ord) AS ids,
    array_agg(ws.ix ORDER BY rec.ord) AS states, array_agg(wt.ix ORDER BY rec.ord) AS taxa,
    array_agg(rec.n ORDER BY rec.ord) AS counts, array_agg(wz.ix ORDER BY rec.ord) AS zones,
    array_agg(coalesce(wse.ix, 0) ORDER BY rec.ord) AS sessions, array_agg(coalesce(wsz.ix, 0) ORDER BY rec.ord) AS session_zones
  FROM rec
  JOIN word ws ON ws.report_id = rec.report_id AND ws.w = rec.state
  JOIN word wt ON wt.report_id = rec.report_id AND wt.w = rec.taxon
  JOIN word wz ON wz.report_id = rec.report_id AND wz.w = rec.zone
  LEFT JOIN word wse ON wse.report_id = rec.report_id AND wse.w = rec.session
  LEFT JOIN word wsz ON wsz.report_id = rec.report_id AND wsz.w = rec.session_zone
  GROUP BY rec.report_id
)
INSERT INTO "report_inputs" ("report_id", "record_count", "ids", "words", "states", "taxa", "counts", "zones", "sessions", "session_zones")
SELECT r.id, coalesce(p.n, 0), coalesce(p.ids, '{}'), coalesce(w.words, '{}'), coalesce(p.states, '{}'), coalesce(p.taxa, '{}'),
  coalesce(p.counts, '{}'), coalesce(p.zones, '{}'), coalesce(p.sessions, '{}'), coalesce(p.session_zones, '{}')
FROM reports r LEFT JOIN packed p ON p.report_id = r.id LEFT JOIN words w ON w.report_id = r.id;
--> statement-breakpoint
ALTER TABLE "reports" ADD CONSTRAINT "reports_id_report_inputs_report_id_fk" FOREIGN KEY ("id") REFERENCES "public"."report_inputs"("report_id") ON DELETE restrict ON UPDATE no action;--> statement-breakpoint
-- A report's inputs never change, as the report itself (migration 0002).
CREATE TRIGGER report_inputs_append_only BEFORE UPDATE OR DELETE ON report_inputs
  FOR EACH ROW EXECUTE FUNCTION ecotone_refuse_change();
--> statement-breakpoint
CREATE TRIGGER report_inputs_no_truncate BEFORE TRUNCATE ON report_inputs
  FOR EACH STATEMENT EXECUTE FUNCTION ecotone_refuse_change();
--> statement-breakpoint
ALTER TABLE "reports" DROP COLUMN "input_records";