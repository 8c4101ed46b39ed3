import "server-only";
import { sql } from "drizzle-orm";
import { getDb, getReadDb, type Db, type Tx } from "../client";
import { reports } from "../schema";
import { columnsOfRow, PACKED_COLUMNS, recordsOfRow, type PackedText } from "./report-inputs";
import type { Results } from "@/lib/results/compute";
import type { METHOD_NOTES } from "@/lib/results/methods";
import type { InputColumns, InputRecord, ReportChanges } from "@/lib/results/records";
import { taxaMeta } from "./results";
import type { Sensitivity } from "@/lib/domain";
import { publicResults, type PublicPolicy } from "@/lib/results/public";
import type { DwcDataset, DwcSession } from "@/lib/results/dwc";
import type { DataLicense } from "@/lib/results/licenses";
import type { ReportBesideEarlier } from "@/lib/results/compare-events";

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
  note?: string;
  /** Beside an earlier event of the site, frozen at publishing; null without one. */
  besideEarlier?: ReportBesideEarlier | null;
};

export type ReportSummary = Pick<ReportRow, "id" | "version" | "publishedAt" | "inputHash" | "changes"> & {
  superseded: boolean;
  publisherName: string | null;
  withdrawnAt: Date | null;
  withdrawReason: string | null;
};

/** A withdrawn version: when, by whom (their name for the organisers' list only) and why. */
export type Withdrawal = { withdrawnAt: Date; reason: string };

/**
 * Runs `work` in one transaction under the event's report lock, so that two publishes
 * of one event never compute the same version and every read sees one snapshot.
 */
export async function inReportTransaction<T>(eventId: string, work: (tx: Tx) => Promise<T>): Promise<T> {
  return getDb().transaction(async (tx) => {
    await tx.execute(sql`SELECT pg_advisory_xact_lock(hashtext('report:' || ${eventId}))`);
    // Reading every input record of a large event sorts and hashes hundreds of thousands of rows:
    // room to do it in memory, and no JIT compilation (it cost about a second for a query run once).
    await tx.execute(sql`SELECT set_config('work_mem', '128MB', true), set_config('jit', 'off', true)`);
    return work(tx);
  });
}

/** The newest version's number, input records (column by column) and results, for the next version's changes. */
export async function latestReportInputs(
  eventId: string,
  tx: Tx,
): Promise<{ version: number; inputs: InputColumns; results: Results } | null> {
  // The newest version picked first: the packed columns are then read out of one row, not every version's.
  const [prev] = (
    await tx.execute<{ version: number; results: Results } & PackedText>(sql`
    SELECT r.version, r.results, ${PACKED_COLUMNS}
    FROM (SELECT id, version, results FROM reports WHERE event_id = ${eventId} ORDER BY version DESC LIMIT 1) r
    JOIN report_inputs i ON i.report_id = r.id`)
  ).rows;
  return prev ? { version: prev.version, results: prev.results, inputs: columnsOfRow(prev) } : null;
}

export type NewReport = Omit<ReportRow, "publishedAt">;

/**
 * Stores a report whose input records this transaction has already written under the same id
 * (report_inputs: db/queries/report-inputs.ts); the report row references them.
 */
export async function insertReport(report: NewReport, tx: Tx): Promise<string> {
  const [row] = await tx.insert(reports).values(report).returning({ id: reports.id });
  return row!.id;
}

/** Everyone who takes part in the event, with the event's name and address, for the publish e-mail. */
export async function reportRecipients(
  eventId: string,
  tx: Tx,
): Promise<{ email: string; locale: string; eventName: string; eventSlug: string }[]> {
  const people = await tx.execute<{ email: string; locale: string; eventName: string; eventSlug: string }>(sql`
    SELECT u.email, u.locale, e.name AS "eventName", e.slug AS "eventSlug"
    FROM event_members m JOIN users u ON u.id = m.user_id JOIN events e ON e.id = m.event_id
    WHERE m.event_id = ${eventId} ORDER BY u.email`);
  return people.rows;
}

export async function listReports(eventId: string): Promise<ReportSummary[]> {
  const r = await getDb().execute<Omit<ReportSummary, "superseded">>(sql`
    SELECT r.id, r.version, r.published_at AS "publishedAt", r.input_hash AS "inputHash", r.changes, u.name AS "publisherName",
      w.withdrawn_at AS "withdrawnAt", w.reason AS "withdrawReason"
    FROM reports r LEFT JOIN users u ON u.id = r.published_by LEFT JOIN report_withdrawals w ON w.report_id = r.id
    WHERE r.event_id = ${eventId} ORDER BY r.version DESC`);
  const latest = r.rows[0]?.version ?? 0;
  return r.rows.map((x) => ({
    ...x,
    publishedAt: new Date(x.publishedAt),
    withdrawnAt: x.withdrawnAt ? new Date(x.withdrawnAt) : null,
    superseded: x.version < latest,
  }));
}

/**
 * Withdraws a version (issue 16): one append-only row with the reason; the report and its data
 * stay. False when the version was already withdrawn.
 */
export async function insertWithdrawal(reportId: string, userId: string, reason: string, tx: Tx): Promise<boolean> {
  const r = await tx.execute(sql`
    INSERT INTO report_withdrawals (report_id, withdrawn_by, reason) VALUES (${reportId}, ${userId}, ${reason})
    ON CONFLICT (report_id) DO NOTHING RETURNING report_id`);
  return r.rows.length === 1;
}

/** The newest version that is not withdrawn, for links to "the latest report". */
export async function latestStandingVersion(eventId: string): Promise<number | null> {
  const r = await getReadDb().execute<{ version: number }>(sql`
    SELECT r.version FROM reports r WHERE r.event_id = ${eventId}
      AND NOT EXISTS (SELECT 1 FROM report_withdrawals w WHERE w.report_id = r.id)
    ORDER BY r.version DESC LIMIT 1`);
  return r.rows[0]?.version ?? null;
}

/** One version; its input records (large for a big event) only when asked for. */
export async function getReport(
  eventId: string,
  version: number,
  options: { withInputs?: boolean; primary?: boolean } = {},
): Promise<
  | (ReportRow & {
      inputRecords: InputRecord[];
      inputCount: number;
      latestVersion: number;
      note: string;
      withdrawal: Withdrawal | null;
    })
  | null
> {
  const inputs = options.withInputs
    ? PACKED_COLUMNS
    : sql`NULL AS ids, NULL AS words, NULL AS states, NULL AS taxa, NULL AS counts, NULL AS zones, NULL AS sessions, NULL AS "sessionZones"`;
  // Public reads come from the replica when there is one (db/client.ts getReadDb); a read
  // that decides a write asks for the primary, and a version the replica does not have yet
  // (published a moment ago) is read from the primary too.
  const db = options.primary ? getDb() : getReadDb();
  const r = await db.execute<
    ReportRow &
      PackedText & {
        inputCount: number;
        latestVersion: number;
        note: string;
        withdrawnAt: string | null;
        withdrawReason: string | null;
      }
  >(sql`
    SELECT reports.id, event_id AS "eventId", version, published_at AS "publishedAt", published_by AS "publishedBy",
      engine_version AS "engineVersion", input_hash AS "inputHash", ${inputs},
      i.record_count AS "inputCount", results,
      method_notes AS "methodNotes", changes, note, beside_earlier AS "besideEarlier",
      (SELECT max(version) FROM reports x WHERE x.event_id = reports.event_id)::int AS "latestVersion",
      w.withdrawn_at AS "withdrawnAt", w.reason AS "withdrawReason"
    FROM reports JOIN report_inputs i ON i.report_id = reports.id
    LEFT JOIN report_withdrawals w ON w.report_id = reports.id
    WHERE event_id = ${eventId} AND version = ${version}`);
  const row = r.rows[0];
  if (!row) return db === getDb() ? null : getReport(eventId, version, { ...options, primary: true });
  const { withdrawnAt, withdrawReason, ids, words, states, taxa, counts, zones, sessions, sessionZones, ...rest } = row;
  const packed = { ids, words, states, taxa, counts, zones, sessions, sessionZones };
  return {
    ...rest,
    inputRecords: options.withInputs ? recordsOfRow(packed) : [],
    publishedAt: new Date(row.publishedAt),
    withdrawal: withdrawnAt ? { withdrawnAt: new Date(withdrawnAt), reason: withdrawReason ?? "" } : null,
  };
}

export async function getReportById(id: string, options: { withInputs?: boolean } = {}) {
  const find = (db: Pick<Db, "execute">) =>
    db.execute<{ eventId: string; version: number }>(
      sql`SELECT event_id AS "eventId", version FROM reports WHERE id = ${id}`,
    );
  const row =
    (await find(getReadDb())).rows[0] ?? (getReadDb() === getDb() ? undefined : (await find(getDb())).rows[0]);
  return row ? getReport(row.eventId, row.version, options) : null;
}

/**
 * The names a report's downloads carry (the event's, its address and its organisation's), for an
 * event the public may see: none while it is a draft, so the files follow their page (issue 13).
 */
export type ReportEvent = {
  name: string;
  slug: string;
  organisation: string;
  startsAt: Date;
  endsAt: Date;
  timeZone: string;
  dataLicense: DataLicense;
  publishAbsences: boolean;
  isDemo: boolean;
};

export async function reportEventNames(eventId: string): Promise<ReportEvent | null> {
  const [event] = (
    await getReadDb().execute<ReportEvent>(sql`
    SELECT e.name, e.slug, o.name AS organisation, e.starts_at AS "startsAt", e.ends_at AS "endsAt",
      e.time_zone AS "timeZone", e.data_license AS "dataLicense", e.publish_absences AS "publishAbsences", e.is_demo AS "isDemo"
    FROM events e JOIN organisations o ON o.id = e.organisation_id
    WHERE e.id = ${eventId} AND e.status <> 'draft'`)
  ).rows;
  return event ? { ...event, startsAt: new Date(event.startsAt), endsAt: new Date(event.endsAt) } : null;
}

const uuidArray = (ids: readonly string[]) =>
  sql.raw(`ARRAY[${ids.map((id) => `'${id.replace(/[^0-9a-f-]/gi, "")}'`).join(",")}]::uuid[]`);

// A person as the open data names them: their chosen published name, else an anonymous id; never an e-mail.
const PUBLIC_PERSON = (u: string) =>
  sql.raw(`coalesce(${u}.published_name, 'recorder-' || left(md5(${u}.id::text), 8))`);

/**
 * What the Event-core archive needs beyond the located rows (lib/results/dwc.ts): each sighting's
 * count session and approving coordinator, the sessions (complete ones of the report included),
 * the event's open listed taxa and, per complete session, every taxon noted in it.
 */
export async function reportDwcContext(
  eventId: string,
  report: { inputRecords: InputRecord[] },
  locale: string,
): Promise<Pick<DwcDataset, "sightings" | "sessions" | "listed" | "noted">> {
  const sightingIds = report.inputRecords.filter((r) => r[1] !== "session").map((r) => r[0]);
  const completeZone = new Map(report.inputRecords.filter((r) => r[1] === "session").map((r) => [r[0], r[6]] as const));
  const db = getReadDb();
  const sightings = sightingIds.length
    ? (
        await db.execute<{ id: string; sessionId: string | null; identifiedBy: string | null }>(sql`
    SELECT s.id, s.session_id AS "sessionId", d.name AS "identifiedBy"
    FROM sightings s
    LEFT JOIN LATERAL (
      SELECT ${PUBLIC_PERSON("u")} AS name FROM reviews r JOIN users u ON u.id = r.reviewer_id
      WHERE r.sighting_id = s.id AND r.event_id = s.event_id AND r.to_state = 'approved' ORDER BY r.decided_at DESC, r.id DESC LIMIT 1
    ) d ON true
    WHERE s.event_id = ${eventId} AND s.id = ANY(${uuidArray(sightingIds)})`)
      ).rows
    : [];
  const sessionIds = [
    ...new Set([...sightings.map((s) => s.sessionId).filter((x): x is string => !!x), ...completeZone.keys()]),
  ];
  const sessions = sessionIds.length
    ? (
        await db.execute<{
          id: string;
          kind: DwcSession["kind"];
          startedAt: string;
          endedAt: string | null;
          complete: boolean;
          distanceM: number | null;
          zoneId: string | null;
          recordedBy: string;
        }>(sql`
    SELECT c.id, c.kind::text AS kind, c.started_at AS "startedAt", c.ended_at AS "endedAt",
      c.all_species_noted AS complete, c.distance_m::float8 AS "distanceM", c.zone_id AS "zoneId",
      ${PUBLIC_PERSON("u")} AS "recordedBy"
    FROM count_sessions c JOIN users u ON u.id = c.user_id
    WHERE c.event_id = ${eventId} AND c.id = ANY(${uuidArray(sessionIds)}) ORDER BY c.started_at, c.id`)
      ).rows
    : [];
  const zoneNames = new Map(
    (
      await db.execute<{ id: string; name: string }>(sql`SELECT id, name FROM zones WHERE event_id = ${eventId}`)
    ).rows.map((z) => [z.id, z.name]),
  );
  // A complete session sits in the zone the results counted it in (method note "sessionZone").
  const zoneOf = (id: string, started: string | null) => {
    const z = completeZone.has(id) ? completeZone.get(id) : started;
    return z && zoneNames.has(z) ? z : null;
  };
  const listed = (
    await db.execute<{ id: string; scientificName: string; rank: string; vernacularName: string | null }>(sql`
    SELECT t.id, t.scientific_name AS "scientificName", t.rank::text AS rank,
      coalesce(n.name, en.name) AS "vernacularName"
    FROM event_species es JOIN taxa t ON t.id = es.taxon_id
    LEFT JOIN taxon_names n ON n.taxon_id = t.id AND n.locale = ${locale}
    LEFT JOIN taxon_names en ON en.taxon_id = t.id AND en.locale = 'en'
    WHERE es.event_id = ${eventId} AND t.sensitivity = 'open' ORDER BY t.scientific_name`)
  ).rows.map((t) => ({ ...t, vernacularName: t.vernacularName ?? "" }));
  const complete = sessions.filter((s) => s.complete).map((s) => s.id);
  const noted = new Map<string, Set<string>>();
  if (complete.length) {
    const r = await db.execute<{ sessionId: string; taxonId: string }>(sql`
      SELECT DISTINCT session_id AS "sessionId", taxon_id AS "taxonId" FROM sightings
      WHERE session_id = ANY(${uuidArray(complete)}) AND taxon_id IS NOT NULL AND review_state <> 'rejected'`);
    for (const x of r.rows) noted.set(x.sessionId, (noted.get(x.sessionId) ?? new Set()).add(x.taxonId));
  }
  return {
    sightings: new Map(sightings.map((s) => [s.id, { sessionId: s.sessionId, identifiedBy: s.identifiedBy ?? "" }])),
    sessions: sessions.map((s) => {
      const zoneId = zoneOf(s.id, s.zoneId);
      return {
        ...s,
        startedAt: new Date(s.startedAt),
        endedAt: s.endedAt ? new Date(s.endedAt) : null,
        zoneId,
        zoneName: zoneId ? zoneNames.get(zoneId)! : null,
      };
    }),
    listed,
    noted,
  };
}

/** Credits: how many volunteers and coordinators took part (never who). */
export async function eventCredits(eventId: string): Promise<{ volunteers: number; coordinators: number }> {
  const r = await getReadDb().execute<{ volunteers: number; coordinators: number }>(sql`
    SELECT count(*) FILTER (WHERE role = 'volunteer')::int AS volunteers, count(*) FILTER (WHERE role = 'coordinator')::int AS coordinators
    FROM event_members WHERE event_id = ${eventId}`);
  return r.rows[0] ?? { volunteers: 0, coordinators: 0 };
}

export type Occurrence = {
  id: string;
  observedAt: Date;
  lon: number;
  lat: number;
  accuracyM: number;
  taxonId: string;
  count: number;
  sensitivity: Sensitivity;
  recordedBy: string;
};

/**
 * The report's occurrences with their exact locations, for the export layer to
 * generalise or withhold. Taxon and count are those recorded in the report.
 */
export async function reportOccurrences(report: {
  eventId: string;
  inputRecords: InputRecord[];
  results: Results;
}): Promise<Occurrence[]> {
  const ids = report.inputRecords.map((r) => r[0]);
  if (!ids.length) return [];
  // recordedBy: the name the recorder chose to publish, else an anonymous recorder id; never an e-mail.
  const r = await getReadDb().execute<{
    id: string;
    observedAt: string;
    lon: number;
    lat: number;
    accuracyM: number;
    recordedBy: string;
  }>(sql`
    SELECT s.id, s.observed_at AS "observedAt", ST_X(s.location) AS lon, ST_Y(s.location) AS lat, s.accuracy_m::float8 AS "accuracyM",
      coalesce(u.published_name, 'recorder-' || left(md5(u.id::text), 8)) AS "recordedBy"
    FROM sightings s JOIN users u ON u.id = s.user_id WHERE s.event_id = ${report.eventId} AND s.id = ANY(${sql.raw(`ARRAY[${ids.map((id) => `'${id.replace(/[^0-9a-f-]/gi, "")}'`).join(",")}]::uuid[]`)}) ORDER BY s.id`);
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

/**
 * What the public may read of an event's results (lib/results/public.ts): the event's choice for
 * restricted taxa and each taxon's current sensitivity (a raised one applies to past reports too).
 */
export async function publicPolicy(eventId: string, taxonIds: readonly string[]): Promise<PublicPolicy> {
  const [event] = (
    await getReadDb().execute<{ restricted: string }>(
      sql`SELECT public_restricted AS restricted FROM events WHERE id = ${eventId}`,
    )
  ).rows;
  const taxa = await taxaMeta(taxonIds);
  return {
    restricted: event?.restricted === "hidden" ? "hidden" : "event",
    current: new Map([...taxa].map(([id, t]) => [id, t.sensitivity])),
  };
}

/** An event's results as the public may read them. */
export async function publicResultsOf<T extends { species: Results["species"] }>(
  eventId: string,
  results: T,
): Promise<T> {
  return publicResults(
    results,
    await publicPolicy(
      eventId,
      results.species.map((s) => s.id),
    ),
  );
}

export type PreviewRecord = {
  id: string;
  state: string;
  taxon: string | null;
  description: string;
  count: number;
  observedAt: Date;
  volunteer: string;
  marks: string[];
};

/**
 * What the organiser should know before publishing (issue 16): the sightings still pending or
 * returned (left out of the report) and the approved ones that carry check marks (in it), the
 * first `limit` of each with their totals. Names as the review desk shows them to organisers.
 */
export async function previewProblems(
  eventId: string,
  locale: string,
  limit = 30,
): Promise<{ open: PreviewRecord[]; openTotal: number; marked: PreviewRecord[]; markedTotal: number }> {
  const rows = (where: ReturnType<typeof sql>) =>
    getDb().execute<PreviewRecord & { total: number }>(sql`
      SELECT s.id, s.review_state::text AS state, coalesce(n.name, en.name, t.scientific_name) AS taxon, s.description,
        s.count, s.observed_at AS "observedAt", coalesce(u.name, u.published_name, '') AS volunteer,
        s.check_marks::text[] AS marks, count(*) OVER ()::int AS total
      FROM sightings s JOIN users u ON u.id = s.user_id
      LEFT JOIN taxa t ON t.id = s.taxon_id
      LEFT JOIN taxon_names n ON n.taxon_id = t.id AND n.locale = ${locale}
      LEFT JOIN taxon_names en ON en.taxon_id = t.id AND en.locale = 'en'
      WHERE s.event_id = ${eventId} AND ${where}
      ORDER BY s.observed_at, s.id LIMIT ${limit}`);
  const [open, marked] = await Promise.all([
    rows(sql`s.review_state IN ('pending', 'returned')`),
    rows(sql`s.review_state = 'approved' AND cardinality(s.check_marks) > 0`),
  ]);
  const clean = (r: PreviewRecord & { total: number }): PreviewRecord => ({
    id: r.id,
    state: r.state,
    taxon: r.taxon,
    description: r.description,
    count: r.count,
    observedAt: new Date(r.observedAt),
    volunteer: r.volunteer,
    marks: r.marks,
  });
  return {
    open: open.rows.map(clean),
    openTotal: open.rows[0]?.total ?? 0,
    marked: marked.rows.map(clean),
    markedTotal: marked.rows[0]?.total ?? 0,
  };
}
