import "server-only";
import { sql } from "drizzle-orm";
import type { ParsedSheet, SheetProblem } from "@/lib/paper/sheet";
import { zonedLocalToUtc } from "@/lib/time/zoned";
import { getDb } from "../client";
import { countSessions, sightings } from "../schema";
import { refreshCheckMarks } from "./check-marks";

// Paper data sheets into the same review as phone records. The file has already passed
// lib/paper/sheet.ts; here every line is checked against the event (zones, species list,
// observers, the event's session kinds), and only a file without a single problem is
// stored, in one transaction: count sessions first, then their sightings, all pending,
// marked source = paper_sheet with the uploader as transcriber, then the check marks.
//
// Rules a person reads on the page:
// - a taxon is named by its scientific name or a common name of the species list (any
//   language); a common name shared by two taxa is refused as ambiguous;
// - the observer is the event member with that address; without one, the session's
//   observer, else the uploader;
// - a sighting without its own time takes its session's start, without its own zone its
//   session's zone; without coordinates it is placed at a point inside its zone, with an
//   accuracy wide enough to cover the whole zone;
// - coordinates without an accuracy get DEFAULT_ACCURACY_M (common practice for a position
//   read off a map or a handheld GPS).

export const DEFAULT_ACCURACY_M = 100;

export type PaperSummary = { sessions: number; sightings: number; fullLists: number };
export type PaperImportResult = { problems: SheetProblem[]; summary: PaperSummary; saved: boolean };

type EventFacts = { timeZone: string; sessionKinds: string[] };

/** What the template lists: the event's zones, its species list (scientific and common names) and session kinds. */
export async function paperSheetChoices(eventId: string, locale: string) {
  const db = getDb();
  const [event, zoneRows, taxonRows] = await Promise.all([
    db.execute<{ name: string; time_zone: string; session_kinds: string[] }>(
      sql`SELECT name, time_zone, session_kinds::text[] AS session_kinds FROM events WHERE id = ${eventId}`,
    ),
    db.execute<{ name: string }>(sql`SELECT name FROM zones WHERE event_id = ${eventId} ORDER BY name`),
    db.execute<{ scientific_name: string; common: string | null }>(sql`
      SELECT t.scientific_name,
        coalesce((SELECT n.name FROM taxon_names n WHERE n.taxon_id = t.id AND n.locale = ${locale}),
                 (SELECT n.name FROM taxon_names n WHERE n.taxon_id = t.id AND n.locale = 'en')) AS common
      FROM event_species es JOIN taxa t ON t.id = es.taxon_id
      WHERE es.event_id = ${eventId} ORDER BY t.scientific_name`),
  ]);
  const e = event.rows[0];
  if (!e) return null;
  return {
    event: e.name,
    timeZone: e.time_zone,
    sessionKinds: e.session_kinds,
    zones: zoneRows.rows.map((z) => z.name),
    taxa: taxonRows.rows.map((t) => (t.common ? `${t.scientific_name} (${t.common})` : t.scientific_name)),
  };
}

/**
 * Checks the parsed sheet against the event and, when `save` and nothing is wrong, stores
 * it. Problems name the line and column; nothing is stored while any exists.
 */
export async function importPaperSheet(
  eventId: string,
  uploaderId: string,
  sheet: ParsedSheet,
  save: boolean,
): Promise<PaperImportResult> {
  const db = getDb();
  const summary: PaperSummary = {
    sessions: sheet.sessions.length,
    sightings: sheet.sightings.length,
    fullLists: sheet.sessions.filter((s) => s.fullList).length,
  };
  const facts = (
    await db.execute<{ time_zone: string; session_kinds: string[] }>(
      sql`SELECT time_zone, session_kinds::text[] AS session_kinds FROM events WHERE id = ${eventId}`,
    )
  ).rows[0];
  if (!facts) throw new Error(`no event ${eventId}`);
  const event: EventFacts = { timeZone: facts.time_zone, sessionKinds: facts.session_kinds };

  const lines = [...sheet.sessions, ...sheet.sightings];
  const emails = [...new Set(lines.map((l) => l.observerEmail).filter((e): e is string => !!e))];
  const [zoneRows, taxonRows, observerRows] = await Promise.all([
    db.execute<{ id: string; name: string; lon: number; lat: number; radius: number }>(sql`
      SELECT z.id, z.name, ST_X(c.p) AS lon, ST_Y(c.p) AS lat,
        ceil(ST_Length(ST_LongestLine(c.p, z.geom)::geography))::float8 AS radius
      FROM zones z CROSS JOIN LATERAL (SELECT ST_PointOnSurface(z.geom) AS p) c
      WHERE z.event_id = ${eventId}`),
    db.execute<{ id: string; key: string }>(sql`
      SELECT t.id, lower(t.scientific_name) AS key FROM event_species es JOIN taxa t ON t.id = es.taxon_id WHERE es.event_id = ${eventId}
      UNION
      SELECT t.id, lower(n.name) AS key FROM event_species es JOIN taxa t ON t.id = es.taxon_id
        JOIN taxon_names n ON n.taxon_id = t.id WHERE es.event_id = ${eventId}`),
    emails.length
      ? db.execute<{ id: string; email: string }>(sql`
          SELECT u.id, lower(u.email) AS email FROM users u
          WHERE lower(u.email) = ANY(${sql.param(emails)}::text[])
            AND (u.id = ${uploaderId} OR EXISTS (SELECT 1 FROM event_members m WHERE m.event_id = ${eventId} AND m.user_id = u.id))`)
      : Promise.resolve({ rows: [] as { id: string; email: string }[] }),
  ]);
  const zoneByName = new Map(zoneRows.rows.map((z) => [z.name.toLowerCase(), z]));
  const zoneById = new Map(zoneRows.rows.map((z) => [z.id, z]));
  const taxaByKey = new Map<string, Set<string>>();
  for (const t of taxonRows.rows) taxaByKey.set(t.key, (taxaByKey.get(t.key) ?? new Set()).add(t.id));
  const observerByEmail = new Map(observerRows.rows.map((o) => [o.email, o.id]));

  const problems: SheetProblem[] = [];
  const zoneOf = (line: number, name: string | null): string | null => {
    if (!name) return null;
    const z = zoneByName.get(name.toLowerCase());
    if (!z) problems.push({ line, column: "zone", code: "unknownZone", values: { value: name } });
    return z?.id ?? null;
  };
  const observerOf = (line: number, email: string | null): string | null => {
    if (!email) return null;
    const id = observerByEmail.get(email);
    if (!id) problems.push({ line, column: "observer_email", code: "unknownObserver", values: { value: email } });
    return id ?? null;
  };
  // "Anas platyrhynchos (Mallard)", as the template lists it, means the scientific name.
  const taxonOf = (line: number, name: string | null): string | null => {
    if (!name) return null;
    const key = name.toLowerCase();
    const ids = taxaByKey.get(key) ?? taxaByKey.get(key.replace(/\s*\(.*\)$/, ""));
    if (!ids) problems.push({ line, column: "taxon", code: "unknownTaxon", values: { value: name } });
    else if (ids.size > 1) problems.push({ line, column: "taxon", code: "ambiguousTaxon", values: { value: name } });
    return ids?.size === 1 ? [...ids][0]! : null;
  };
  const instant = (local: string) => zonedLocalToUtc(local, event.timeZone);

  type SessionRow = typeof countSessions.$inferInsert;
  const sessionByRef = new Map<string, SessionRow>();
  const sessionRows: SessionRow[] = [];
  for (const s of sheet.sessions) {
    if (!event.sessionKinds.includes(s.kind))
      problems.push({
        line: s.line,
        column: "session_kind",
        code: "sessionKindNotUsed",
        values: { value: s.kind, allowed: event.sessionKinds.join(", ") },
      });
    const row: SessionRow = {
      id: crypto.randomUUID(),
      eventId,
      userId: observerOf(s.line, s.observerEmail) ?? uploaderId,
      zoneId: zoneOf(s.line, s.zone),
      kind: s.kind,
      startedAt: instant(s.start),
      endedAt: s.end ? instant(s.end) : null,
      allSpeciesNoted: s.fullList,
      distanceM: s.distanceM,
      notes: s.notes,
    };
    sessionByRef.set(s.ref.toLowerCase(), row);
    sessionRows.push(row);
  }

  type SightingRow = typeof sightings.$inferInsert;
  const sightingRows: { line: number; row: SightingRow; placeByZone: boolean }[] = [];
  for (const s of sheet.sightings) {
    const session = s.ref ? sessionByRef.get(s.ref.toLowerCase())! : null;
    const zoneId = zoneOf(s.line, s.zone) ?? session?.zoneId ?? null;
    const zone = zoneId ? zoneById.get(zoneId) : undefined;
    if (!s.point && !zone) {
      problems.push({ line: s.line, column: "zone", code: "noPlace" });
      continue;
    }
    const row: SightingRow = {
      id: crypto.randomUUID(),
      eventId,
      userId: observerOf(s.line, s.observerEmail) ?? session?.userId ?? uploaderId,
      sessionId: session?.id ?? null,
      taxonId: taxonOf(s.line, s.taxon),
      description: s.description,
      count: s.count,
      countIsEstimate: s.countIsEstimate,
      observedAt: s.observedAt ? instant(s.observedAt) : (session!.startedAt as Date),
      location: s.point
        ? { longitude: s.point.longitude, latitude: s.point.latitude }
        : { longitude: zone!.lon, latitude: zone!.lat },
      accuracyM: s.point ? (s.point.accuracyM ?? DEFAULT_ACCURACY_M) : Math.max(1, zone!.radius),
      zoneId,
      notes: s.notes,
      reviewState: "pending",
      source: "paper_sheet",
      transcribedBy: uploaderId,
    };
    sightingRows.push({ line: s.line, row, placeByZone: !!s.point && !zoneId });
  }
  problems.sort((a, b) => a.line - b.line);
  if (problems.length || !save) return { problems, summary, saved: false };

  await db.transaction(async (tx) => {
    if (sessionRows.length) await tx.insert(countSessions).values(sessionRows);
    // Coordinates without a zone: the smallest zone that covers the point, as for phone records.
    for (const s of sightingRows.filter((r) => r.placeByZone)) {
      const { longitude, latitude } = s.row.location as { longitude: number; latitude: number };
      const found = await tx.execute<{ id: string }>(sql`
        SELECT z.id FROM zones z WHERE z.event_id = ${eventId}
          AND ST_Covers(z.geom, ST_SetSRID(ST_MakePoint(${longitude}, ${latitude}), 4326))
        ORDER BY ST_Area(z.geom), z.id LIMIT 1`);
      s.row.zoneId = found.rows[0]?.id ?? null;
    }
    for (let i = 0; i < sightingRows.length; i += 500)
      await tx.insert(sightings).values(sightingRows.slice(i, i + 500).map((r) => r.row));
    await refreshCheckMarks(
      tx,
      sightingRows.map((r) => r.row.id),
      eventId,
    );
  });
  return { problems: [], summary, saved: true };
}
