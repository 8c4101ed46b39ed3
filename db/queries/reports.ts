import "server-only";
import { sql } from "drizzle-orm";
import { getDb } from "../client";
import { reports } from "../schema";
import { enqueueMail, type OutboxMail } from "./mail-queue";
import { canonicalJson, computeResults, type Results } from "@/lib/results/compute";
import { METHOD_NOTES } from "@/lib/results/methods";
import { diffRecords, inputFromRecords, inputHash, type InputRecord, type ReportChanges } from "@/lib/results/records";
import { eventZones, loadInputRecords, pendingCounts, taxaMeta } from "./results";
import type { Pending } from "@/lib/results/compute";

/** Publishing while sightings wait for review needs `confirmPending` (the number is in the report). */
export class PendingRecordsError extends Error {
  constructor(readonly pending: Pending) {
    super("pending records");
  }
}

export type ReportRow = {
  id: string;
  eventId: string;
  version: number;
  publishedAt: Date;
  publishedBy: string;
  engineVersion: string;
  inputHash: string;
  results: Results;
  methodNotes: typeof METHOD_NOTES;
  changes: ReportChanges | Record<string, never>;
};

export type ReportSummary = Pick<ReportRow, "id" | "version" | "publishedAt" | "inputHash" | "changes"> & { superseded: boolean; publisherName: string | null };

export type PublishMail = (report: { version: number; eventName: string; eventSlug: string }, person: { email: string; locale: string }) => OutboxMail;

/**
 * Freezes the event's current results into the next report version, in one transaction
 * under a per-event lock: inputs read in one snapshot, results computed from exactly
 * those inputs, what changed since the previous version, and the participants' e-mails.
 */
export async function publishReport(eventId: string, userId: string, mailFor: PublishMail, options: { confirmPending?: boolean } = {}): Promise<{ id: string; version: number }> {
  return getDb().transaction(async (tx) => {
    await tx.execute(sql`SELECT pg_advisory_xact_lock(hashtext('report:' || ${eventId}))`);
    const pending = await pendingCounts(eventId, tx);
    if (pending.pending + pending.returned > 0 && !options.confirmPending) throw new PendingRecordsError(pending);
    const records = await loadInputRecords(eventId, tx);
    const zones = await eventZones(eventId, tx);
    const meta = await taxaMeta([...new Set(records.map((r) => r[2]))], tx, eventId);
    const results = computeResults({ ...inputFromRecords(records, zones, meta), pending });
    const [prev] = (await tx.execute<{ version: number; inputRecords: InputRecord[]; results: Results }>(sql`
      SELECT version, input_records AS "inputRecords", results FROM reports WHERE event_id = ${eventId} ORDER BY version DESC LIMIT 1`)).rows;
    const version = (prev?.version ?? 0) + 1;
    let changes: ReportChanges | Record<string, never> = {};
    if (prev) {
      const names = new Map<string, string>([...prev.results.species.map((s) => [s.id, s.scientificName] as const), ...[...meta.values()].map((t) => [t.id, t.scientificName] as const)]);
      changes = diffRecords(prev.version, prev.inputRecords, records, (id) => names.get(id) ?? id);
    }
    const [row] = await tx.insert(reports).values({
      eventId, version, publishedBy: userId, engineVersion: results.engineVersion,
      inputHash: inputHash(records), inputRecords: records, results: JSON.parse(canonicalJson(results)), methodNotes: METHOD_NOTES, changes,
    }).returning({ id: reports.id });
    const people = await tx.execute<{ email: string; locale: string; eventName: string; eventSlug: string }>(sql`
      SELECT u.email, u.locale, e.name AS "eventName", e.slug AS "eventSlug"
      FROM event_members m JOIN users u ON u.id = m.user_id JOIN events e ON e.id = m.event_id
      WHERE m.event_id = ${eventId} ORDER BY u.email`);
    await enqueueMail(people.rows.map((p) => mailFor({ version, eventName: p.eventName, eventSlug: p.eventSlug }, p)), tx);
    return { id: row!.id, version };
  });
}

export async function listReports(eventId: string): Promise<ReportSummary[]> {
  const r = await getDb().execute<Omit<ReportSummary, "superseded">>(sql`
    SELECT r.id, r.version, r.published_at AS "publishedAt", r.input_hash AS "inputHash", r.changes, u.name AS "publisherName"
    FROM reports r LEFT JOIN users u ON u.id = r.published_by WHERE r.event_id = ${eventId} ORDER BY r.version DESC`);
  const latest = r.rows[0]?.version ?? 0;
  return r.rows.map((x) => ({ ...x, publishedAt: new Date(x.publishedAt), superseded: x.version < latest }));
}

/** One version; its input records (large for a big event) only when asked for. */
export async function getReport(eventId: string, version: number, options: { withInputs?: boolean } = {}): Promise<(ReportRow & { inputRecords: InputRecord[]; inputCount: number; latestVersion: number }) | null> {
  const inputs = options.withInputs ? sql`input_records` : sql`'[]'::jsonb`;
  const r = await getDb().execute<ReportRow & { inputRecords: InputRecord[]; inputCount: number; latestVersion: number }>(sql`
    SELECT id, event_id AS "eventId", version, published_at AS "publishedAt", published_by AS "publishedBy",
      engine_version AS "engineVersion", input_hash AS "inputHash", ${inputs} AS "inputRecords",
      jsonb_array_length(input_records) AS "inputCount", results,
      method_notes AS "methodNotes", changes,
      (SELECT max(version) FROM reports x WHERE x.event_id = reports.event_id)::int AS "latestVersion"
    FROM reports WHERE event_id = ${eventId} AND version = ${version}`);
  const row = r.rows[0];
  return row ? { ...row, publishedAt: new Date(row.publishedAt) } : null;
}

export async function getReportById(id: string, options: { withInputs?: boolean } = {}) {
  if (!/^[0-9a-f-]{36}$/i.test(id)) return null;
  const r = await getDb().execute<{ eventId: string; version: number }>(sql`SELECT event_id AS "eventId", version FROM reports WHERE id = ${id}`);
  const row = r.rows[0];
  return row ? getReport(row.eventId, row.version, options) : null;
}

/** Credits: how many volunteers and coordinators took part (never who). */
export async function eventCredits(eventId: string): Promise<{ volunteers: number; coordinators: number }> {
  const r = await getDb().execute<{ volunteers: number; coordinators: number }>(sql`
    SELECT count(*) FILTER (WHERE role = 'volunteer')::int AS volunteers, count(*) FILTER (WHERE role = 'coordinator')::int AS coordinators
    FROM event_members WHERE event_id = ${eventId}`);
  return r.rows[0] ?? { volunteers: 0, coordinators: 0 };
}

/** Re-computes a report from its recorded inputs alone and compares every number. */
export async function checkReport(eventId: string, version: number): Promise<{ same: boolean; hashSame: boolean; recomputed: Results } | null> {
  const report = await getReport(eventId, version, { withInputs: true });
  if (!report) return null;
  const zones = report.results.zones.map((z) => ({ id: z.id, name: z.name, habitat: z.habitat }));
  const meta = new Map(report.results.species.map((s) => [s.id, { id: s.id, scientificName: s.scientificName, rank: s.rank, group: s.group, sensitivity: s.sensitivity, names: s.names, countUnit: s.countUnit }]));
  // The pending numbers are a fact declared at publishing, not computed from the inputs.
  const recomputed = computeResults({ ...inputFromRecords(report.inputRecords, zones, meta), pending: report.results.pending ?? undefined });
  return {
    same: canonicalJson(JSON.parse(canonicalJson(recomputed))) === canonicalJson(report.results),
    hashSame: inputHash(report.inputRecords) === report.inputHash,
    recomputed,
  };
}

export type Occurrence = {
  id: string; observedAt: Date; lon: number; lat: number; accuracyM: number;
  taxonId: string; count: number; sensitivity: "open" | "generalised" | "restricted";
};

/**
 * The report's occurrences with their exact locations, for the export layer to
 * generalise or withhold. Taxon and count are those recorded in the report.
 */
export async function reportOccurrences(report: { inputRecords: InputRecord[]; results: Results }): Promise<Occurrence[]> {
  const ids = report.inputRecords.map((r) => r[0]);
  if (!ids.length) return [];
  const r = await getDb().execute<{ id: string; observedAt: string; lon: number; lat: number; accuracyM: number }>(sql`
    SELECT s.id, s.observed_at AS "observedAt", ST_X(s.location) AS lon, ST_Y(s.location) AS lat, s.accuracy_m::float8 AS "accuracyM"
    FROM sightings s WHERE s.id = ANY(${sql.raw(`ARRAY[${ids.map((id) => `'${id.replace(/[^0-9a-f-]/gi, "")}'`).join(",")}]::uuid[]`)}) ORDER BY s.id`);
  const rec = new Map(report.inputRecords.map((x) => [x[0], x]));
  const taxa = await taxaMeta([...new Set(report.inputRecords.map((x) => x[2]))]); // session records' "" is skipped
  const recorded = new Map(report.results.species.map((s) => [s.id, s.sensitivity]));
  const order = { open: 0, generalised: 1, restricted: 2 } as const;
  return r.rows.map((row) => {
    const [, , taxonId, count] = rec.get(row.id)!;
    // The stricter of the sensitivity recorded in the report and the taxon's current one.
    const a = recorded.get(taxonId) ?? "open";
    const b = taxa.get(taxonId)?.sensitivity ?? "open";
    return { ...row, observedAt: new Date(row.observedAt), taxonId, count, sensitivity: order[a] >= order[b] ? a : b };
  });
}
