import "server-only";
import { and, eq, inArray, sql, type SQL } from "drizzle-orm";
import type { RecordOutcome, RecordRef, RefusalCode } from "@/lib/sync/acks";
import type { ReviewState, SessionRecord, SightingRecord } from "@/lib/sync/records";
import { getDb, type Db } from "../client";
import { reviewOpen } from "@/lib/time/review-period";
import { judgeSession, judgeSighting, outsideSession } from "@/lib/sync/rules";
import { countSessions, events, reviews, sightingVersions, sightings, taxa, zones } from "../schema";
import { refreshCheckMarks } from "./check-marks";

// The server half of the field log's sync (issue 5), below the handler: records already
// parsed with the contract's schemas (lib/sync/records.ts) are judged each on its own, the
// good ones are stored in one transaction, and every record gets its own outcome
// (created / already_had / updated, or refused with a code and the field at fault). Codes
// only: the handler (server/sync/answer.ts) turns them into text in the person's language.
// Ids are made on the device, so a resent batch changes nothing and answers already_had.
//
// The caller has already checked that the person may record at the event (a member,
// volunteer or above): membership is not checked again here.

type Tx = Parameters<Parameters<Db["transaction"]>[0]>[0];

/** A parsed record and its position in its array of the batch. */
export type Indexed<R> = { index: number; record: R };
export type StoreOutcome = RecordRef & RecordOutcome;

export type IngestInput = {
  userId: string; // a member of the event (checked by the caller)
  eventId: string;
  sessions: Indexed<SessionRecord>[];
  sightings: Indexed<SightingRecord>[];
  now?: Date;
};

// `real` columns hold single-precision floats: compare at that precision.
const sameReal = (a: number | null, b: number | null) =>
  a === null || b === null ? a === b : Math.fround(a) === Math.fround(b);
const sameTime = (a: Date | null, iso: string | null) =>
  a === null || iso === null ? a === null && iso === null : a.getTime() === Date.parse(iso);
const lower = (id: string | null) => id?.toLowerCase() ?? null;

type Good<R> = { index: number; rec: R };

/** reviews.reason of a volunteer's own change: a withdrawal, a correction. */
export const WITHDRAWN = "withdrawn";
export const CORRECTED = "corrected";

type StoredSighting = {
  sessionId: string | null;
  taxonId: string | null;
  description: string;
  count: number;
  countIsEstimate: boolean;
  observedAt: Date;
  longitude: number;
  latitude: number;
  accuracyM: number;
  notes: string;
};

/**
 * What a resent sighting changes, one line per field ("count: 2 → 4"), in the data's own
 * terms (ids, ISO times) so that it reads the same in every language; empty when nothing changed.
 */
function changedFields(
  row: StoredSighting,
  rec: SightingRecord,
  f: { sessionId: string | null; taxonId: string | null; observedAt: Date },
): string[] {
  const out: string[] = [];
  const line = (name: string, from: unknown, to: unknown) =>
    out.push(
      `${name}: ${from === null || from === "" ? "—" : String(from)} → ${to === null || to === "" ? "—" : String(to)}`,
    );
  if (row.sessionId !== f.sessionId) line("sessionId", row.sessionId, f.sessionId);
  if (row.taxonId !== f.taxonId) line("taxonId", row.taxonId, f.taxonId);
  if (row.description !== rec.description) line("description", row.description, rec.description);
  if (row.count !== rec.count) line("count", row.count, rec.count);
  if (row.countIsEstimate !== rec.countIsEstimate) line("countIsEstimate", row.countIsEstimate, rec.countIsEstimate);
  if (row.observedAt.getTime() !== f.observedAt.getTime())
    line("observedAt", row.observedAt.toISOString(), f.observedAt.toISOString());
  if (Number(row.longitude) !== rec.longitude || Number(row.latitude) !== rec.latitude)
    line("location", `${Number(row.latitude)}, ${Number(row.longitude)}`, `${rec.latitude}, ${rec.longitude}`);
  if (!sameReal(row.accuracyM, rec.accuracyM)) line("accuracyM", row.accuracyM, rec.accuracyM);
  if (row.notes !== rec.notes) line("notes", row.notes, rec.notes);
  return out;
}
type Kind = StoreOutcome["kind"];
const refused = (
  kind: Kind,
  index: number,
  id: string,
  code: RefusalCode,
  field: string,
  values?: Record<string, string | number>,
): StoreOutcome => ({ kind, id, index, outcome: "refused", code, field, ...(values ? { values } : {}) });

export async function ingestBatch(input: IngestInput): Promise<StoreOutcome[]> {
  const now = input.now ?? new Date();
  // Ids compare as text below: one spelling for every uuid.
  const sessionsIn = input.sessions.map(({ index, record: r }) => ({
    index,
    rec: { ...r, id: r.id.toLowerCase(), zoneId: lower(r.zoneId) },
  }));
  const sightingsIn = input.sightings.map(({ index, record: r }) => ({
    index,
    rec: {
      ...r,
      id: r.id.toLowerCase(),
      sessionId: lower(r.sessionId),
      taxonId: lower(r.taxonId),
      zoneId: lower(r.zoneId),
    },
  }));

  const db = getDb();
  const [event] = await db
    .select({
      status: events.status,
      sessionKinds: events.sessionKinds,
      startsAt: events.startsAt,
      endsAt: events.endsAt,
      reviewClosesAt: events.reviewClosesAt,
    })
    .from(events)
    .where(eq(events.id, input.eventId))
    .limit(1);
  // A closed event still takes answers, corrections and withdrawals of records it already
  // has while its review period lasts; new records only while it is open.
  const mayCreate = event?.status === "open";
  if (!event || !reviewOpen(event, now)) {
    return [
      ...sessionsIn.map(({ index, rec }) => refused("session", index, rec.id, "event_not_open", "eventId")),
      ...sightingsIn.map(({ index, rec }) => refused("sighting", index, rec.id, "event_not_open", "eventId")),
    ];
  }

  // ---- judge each record alone (no database writes yet)
  // The event's zones, for the sessions' zone check (a batch of sightings alone needs none).
  const eventZones = new Set(
    sessionsIn.length
      ? (await db.select({ id: zones.id }).from(zones).where(eq(zones.eventId, input.eventId))).map((z) => z.id)
      : [],
  );
  const sessionOutcomes: StoreOutcome[] = [];
  const goodSessions = sessionsIn.filter(({ index, rec }) => {
    // A cancellation stores nothing of the session: it is taken whatever the event's kinds and zones are now.
    const bad = rec.cancelled ? null : judgeSession(rec, { kinds: event.sessionKinds, zoneIds: eventZones });
    if (bad) sessionOutcomes.push(refused("session", index, rec.id, bad.code, bad.field, bad.values));
    return !bad;
  });

  const sightingOutcomes: StoreOutcome[] = [];
  const taxonIds = [...new Set(sightingsIn.map((s) => s.rec.taxonId).filter((x): x is string => x !== null))];
  const knownTaxa = new Set(
    taxonIds.length
      ? (await db.select({ id: taxa.id }).from(taxa).where(inArray(taxa.id, taxonIds))).map((r) => r.id)
      : [],
  );
  const goodSightings = sightingsIn.filter(({ index, rec }) => {
    const bad = judgeSighting(rec, { now: now.getTime(), knownTaxa });
    if (bad) sightingOutcomes.push(refused("sighting", index, rec.id, bad.code, bad.field, bad.values));
    return !bad;
  });

  // ---- store: one transaction for the batch, sessions before sightings
  await db.transaction(async (tx) => {
    sessionOutcomes.push(...(await storeSessions(tx, input, goodSessions, mayCreate)));
    // The session a sighting names must be the same person's, at the same event (maybe sent just above).
    const named = [...new Set(goodSightings.map((s) => s.rec.sessionId).filter((x): x is string => x !== null))];
    const ownSessions = new Map(
      named.length
        ? (
            await tx
              .select({ id: countSessions.id, startedAt: countSessions.startedAt, endedAt: countSessions.endedAt })
              .from(countSessions)
              .where(
                and(
                  inArray(countSessions.id, named),
                  eq(countSessions.userId, input.userId),
                  eq(countSessions.eventId, input.eventId),
                ),
              )
          ).map((r) => [r.id, r] as const)
        : [],
    );
    const storable = goodSightings.filter(({ index, rec }) => {
      if (rec.sessionId === null) return true;
      const own = ownSessions.get(rec.sessionId);
      if (!own) sightingOutcomes.push(refused("sighting", index, rec.id, "unknown_session", "sessionId"));
      else if (outsideSession(rec.observedAt, own))
        sightingOutcomes.push(refused("sighting", index, rec.id, "outside_session", "observedAt"));
      return own && !outsideSession(rec.observedAt, own);
    });
    sightingOutcomes.push(...(await storeSightings(tx, input, storable, mayCreate, now)));
  });

  const byIndex = (a: StoreOutcome, b: StoreOutcome) => a.index - b.index;
  return [...sessionOutcomes.sort(byIndex), ...sightingOutcomes.sort(byIndex)];
}

/**
 * Inserts many rows in one statement inside a savepoint; if PostgreSQL refuses the
 * statement, falls back to one savepoint per row so that one bad row refuses only itself.
 * Returns the ids actually inserted and the indexes of rows that failed.
 */
async function insertEach<R extends { id: string }>(
  tx: Tx,
  rows: R[],
  insert: (tx: Tx, rows: R[]) => Promise<string[]>,
): Promise<{ inserted: Set<string>; failed: Set<string> }> {
  const inserted = new Set<string>();
  const failed = new Set<string>();
  if (!rows.length) return { inserted, failed };
  try {
    for (const id of await tx.transaction((sp) => insert(sp, rows))) inserted.add(id);
  } catch {
    for (const row of rows) {
      try {
        for (const id of await tx.transaction((sp) => insert(sp, [row]))) inserted.add(id);
      } catch (err) {
        console.error("[sync] record not stored", row.id, (err as Error).message);
        failed.add(row.id);
      }
    }
  }
  return { inserted, failed };
}

async function storeSessions(
  tx: Tx,
  input: IngestInput,
  good: Good<SessionRecord>[],
  mayCreate: boolean,
): Promise<StoreOutcome[]> {
  const acks: StoreOutcome[] = [];
  const toRow = (r: SessionRecord) => ({
    id: r.id,
    eventId: input.eventId,
    userId: input.userId,
    zoneId: r.zoneId,
    kind: r.kind,
    startedAt: new Date(r.startedAt),
    endedAt: r.endedAt ? new Date(r.endedAt) : null,
    allSpeciesNoted: r.allSpeciesNoted,
    distanceM: r.distanceM,
    notes: r.notes,
  });
  // A cancelled session is never created: there is nothing to cancel when the server never had it.
  const creatable = mayCreate ? good.filter((g) => !g.rec.cancelled).map((g) => g.rec) : [];
  const { inserted, failed } = await insertEach(tx, creatable, async (sp, rows) =>
    (
      await sp
        .insert(countSessions)
        .values(rows.map(toRow))
        .onConflictDoNothing({ target: countSessions.id })
        .returning({ id: countSessions.id })
    ).map((r) => r.id),
  );
  const rest = good.filter((g) => !inserted.has(g.rec.id) && !failed.has(g.rec.id));
  const existing = new Map(
    (rest.length
      ? await tx
          .select()
          .from(countSessions)
          .where(
            inArray(
              countSessions.id,
              rest.map((g) => g.rec.id),
            ),
          )
          .for("update")
      : []
    ).map((r) => [r.id, r]),
  );
  const claimed = new Set<string>();
  for (const { index, rec } of good) {
    if (failed.has(rec.id)) {
      acks.push(refused("session", index, rec.id, "store_failed", "(record)"));
      continue;
    }
    if (inserted.has(rec.id) && !claimed.has(rec.id)) {
      claimed.add(rec.id);
      acks.push({ kind: "session", id: rec.id, index, outcome: "created" });
      continue;
    }
    const row =
      existing.get(rec.id) ?? (await tx.select().from(countSessions).where(eq(countSessions.id, rec.id)).limit(1))[0];
    if (rec.cancelled) {
      acks.push(await cancelSession(tx, input, index, rec.id, row));
      continue;
    }
    if (!row && !mayCreate) {
      acks.push(refused("session", index, rec.id, "event_not_open", "eventId"));
      continue;
    }
    if (!row || row.userId !== input.userId || row.eventId !== input.eventId) {
      acks.push(refused("session", index, rec.id, "id_taken", "id"));
      continue;
    }
    const same =
      row.kind === rec.kind &&
      row.zoneId === rec.zoneId &&
      sameTime(row.startedAt, rec.startedAt) &&
      sameTime(row.endedAt, rec.endedAt) &&
      row.allSpeciesNoted === rec.allSpeciesNoted &&
      sameReal(row.distanceM, rec.distanceM) &&
      row.notes === rec.notes;
    if (same) {
      acks.push({ kind: "session", id: rec.id, index, outcome: "already_had" });
      continue;
    }
    // A session is sent when it starts and again when it ends: its owner may update it.
    const { id: _id, eventId: _e, userId: _u, ...changes } = toRow(rec);
    try {
      await tx.transaction((sp) => sp.update(countSessions).set(changes).where(eq(countSessions.id, rec.id)));
      acks.push({ kind: "session", id: rec.id, index, outcome: "updated" });
    } catch (err) {
      console.error("[sync] session not updated", rec.id, (err as Error).message);
      acks.push(refused("session", index, rec.id, "store_failed", "(record)"));
    }
  }
  return acks;
}

/**
 * A session cancelled by its volunteer goes; its sightings stay, outside any session (they
 * were seen all the same, only not as part of a sampling unit). Resent after it went, it
 * changes nothing.
 */
async function cancelSession(
  tx: Tx,
  input: IngestInput,
  index: number,
  id: string,
  row: { userId: string; eventId: string } | undefined,
): Promise<StoreOutcome> {
  if (!row) return { kind: "session", id, index, outcome: "already_had" };
  if (row.userId !== input.userId || row.eventId !== input.eventId)
    return refused("session", index, id, "id_taken", "id");
  try {
    await tx.transaction(async (sp) => {
      await sp
        .update(sightings)
        .set({ sessionId: null, updatedAt: new Date() })
        .where(and(eq(sightings.sessionId, id), eq(sightings.userId, input.userId)));
      await sp.delete(countSessions).where(eq(countSessions.id, id));
    });
    return { kind: "session", id, index, outcome: "updated" };
  } catch (err) {
    console.error("[sync] session not cancelled", id, (err as Error).message);
    return refused("session", index, id, "store_failed", "(record)");
  }
}

async function storeSightings(
  tx: Tx,
  input: IngestInput,
  good: Good<SightingRecord>[],
  mayCreate: boolean,
  now: Date,
): Promise<StoreOutcome[]> {
  const acks: StoreOutcome[] = [];
  if (!good.length) return acks;
  // The zone is decided here with PostGIS, whatever the device guessed: the smallest zone
  // that covers the point (ST_Covers counts a point on the boundary as inside).
  const zoneSql = (lon: SQL, lat: SQL) => sql`(
    SELECT z.id FROM ${zones} z
    WHERE z.event_id = ${input.eventId} AND ST_Covers(z.geom, ST_SetSRID(ST_MakePoint(${lon}, ${lat}), 4326))
    ORDER BY ST_Area(z.geom), z.id LIMIT 1)`;
  // New records: one statement for the batch, its columns as arrays (unnest), the zone decided
  // in the same statement. (Building a 50-row VALUES list with the query builder, 13 parameters
  // a row, took about a tenth of the server's CPU under load: issue 18's profile.) Values reach
  // PostgreSQL as the same text as single parameters would, so they are stored the same.
  const { inserted, failed } = await insertEach(tx, mayCreate ? good.map((g) => g.rec) : [], async (sp, rows) => {
    const col = <T>(f: (r: SightingRecord) => T) => sql.param(rows.map(f));
    const result = await sp.execute<{ id: string }>(sql`
      INSERT INTO sightings (id, event_id, user_id, session_id, taxon_id, description, count, count_is_estimate,
        observed_at, location, accuracy_m, zone_id, notes)
      SELECT r.id, ${input.eventId}::uuid, ${input.userId}::uuid, r.session_id, r.taxon_id, r.description, r.count,
        r.estimate, r.observed_at, ST_SetSRID(ST_MakePoint(r.lon, r.lat), 4326), r.accuracy_m,
        ${zoneSql(sql`r.lon`, sql`r.lat`)}, r.notes
      FROM unnest(${col((r) => r.id)}::uuid[], ${col((r) => r.sessionId)}::uuid[], ${col((r) => r.taxonId)}::uuid[],
        ${col((r) => r.description)}::text[], ${col((r) => r.count)}::int[], ${col((r) => r.countIsEstimate)}::boolean[],
        ${col((r) => new Date(r.observedAt).toISOString())}::timestamptz[], ${col((r) => r.longitude)}::float8[],
        ${col((r) => r.latitude)}::float8[], ${col((r) => r.accuracyM)}::real[], ${col((r) => r.notes)}::text[])
        WITH ORDINALITY AS r(id, session_id, taxon_id, description, count, estimate, observed_at, lon, lat, accuracy_m, notes, i)
      ORDER BY r.i
      -- Sightings are partitioned by event (migration 0025): the key is (id, event_id), and a
      -- resend is found in this event's partition.
      ON CONFLICT (id, event_id) DO NOTHING
      RETURNING id`);
    return result.rows.map((r) => r.id);
  });

  // Records the server already has (resent, corrected, answered, withdrawn): their zones, if they moved.
  // (A second record with the id of one just inserted counts as one the server has.)
  const firstOf = new Set<string>();
  const others = good.filter((g) => {
    if (failed.has(g.rec.id)) return false;
    if (!inserted.has(g.rec.id) || firstOf.has(g.rec.id)) return true;
    firstOf.add(g.rec.id);
    return false;
  });
  const zoneOf = new Map<string, string | null>();
  if (others.length) {
    const zoneRows = await tx.execute<{ i: string; zone_id: string | null }>(sql`
      SELECT p.i::int AS i, ${zoneSql(sql`p.lon`, sql`p.lat`)} AS zone_id
      FROM unnest(${`{${others.map((g) => g.rec.longitude).join(",")}}`}::float8[], ${`{${others.map((g) => g.rec.latitude).join(",")}}`}::float8[])
        WITH ORDINALITY AS p(lon, lat, i)`);
    for (const r of zoneRows.rows) zoneOf.set(others[Number(r.i) - 1]!.rec.id, r.zone_id);
  }
  const fields = (r: SightingRecord) => ({
    sessionId: r.sessionId,
    taxonId: r.taxonId,
    description: r.description,
    count: r.count,
    countIsEstimate: r.countIsEstimate,
    observedAt: new Date(r.observedAt),
    location: { longitude: r.longitude, latitude: r.latitude },
    accuracyM: r.accuracyM,
    zoneId: zoneOf.get(r.id) ?? null,
    notes: r.notes,
  });

  const rest = good.filter((g) => !inserted.has(g.rec.id) && !failed.has(g.rec.id)).map((g) => g.rec.id);
  const readExisting = (ids: string[]) =>
    tx
      .select({
        id: sightings.id,
        userId: sightings.userId,
        eventId: sightings.eventId,
        sessionId: sightings.sessionId,
        taxonId: sightings.taxonId,
        description: sightings.description,
        count: sightings.count,
        countIsEstimate: sightings.countIsEstimate,
        observedAt: sightings.observedAt,
        longitude: sql<number>`ST_X(${sightings.location})`,
        latitude: sql<number>`ST_Y(${sightings.location})`,
        accuracyM: sightings.accuracyM,
        notes: sightings.notes,
        reviewState: sightings.reviewState,
        version: sightings.version,
        withdrawnAt: sightings.withdrawnAt,
      })
      .from(sightings)
      .where(and(eq(sightings.eventId, input.eventId), inArray(sightings.id, ids)))
      .for("update");
  const existing = new Map((rest.length ? await readExisting(rest) : []).map((r) => [r.id, r]));
  const claimed = new Set<string>();
  const touched: string[] = [];
  for (const { index, rec } of good) {
    if (failed.has(rec.id)) {
      acks.push(refused("sighting", index, rec.id, "store_failed", "(record)"));
      continue;
    }
    if (inserted.has(rec.id) && !claimed.has(rec.id)) {
      claimed.add(rec.id);
      touched.push(rec.id);
      acks.push({ kind: "sighting", id: rec.id, index, outcome: "created", reviewState: "pending" });
      continue;
    }
    const row = existing.get(rec.id) ?? (await readExisting([rec.id]))[0];
    if (!row && !mayCreate) {
      acks.push(refused("sighting", index, rec.id, "event_not_open", "eventId"));
      continue;
    }
    // Never overwrite another person's record, nor move a record between events.
    if (!row || row.userId !== input.userId || row.eventId !== input.eventId) {
      acks.push(refused("sighting", index, rec.id, "id_taken", "id"));
      continue;
    }
    const state = row.reviewState as ReviewState;
    if (rec.withdrawal) {
      if (row.withdrawnAt) {
        acks.push({ kind: "sighting", id: rec.id, index, outcome: "already_had", reviewState: state });
        continue;
      }
      if (state !== "pending" && state !== "returned") {
        acks.push(refused("sighting", index, rec.id, "not_withdrawable", "withdrawal"));
        continue;
      }
      if (rec.withdrawal.toVersion !== row.version) {
        acks.push(
          refused("sighting", index, rec.id, "stale_version", "withdrawal.toVersion", { version: row.version }),
        );
        continue;
      }
      try {
        await tx.transaction(async (sp) => {
          // Rejected with reason "withdrawn": out of the review queue and of the results
          // (which count approved sightings only), and never approved again (a check constraint).
          await sp
            .update(sightings)
            .set({ reviewState: "rejected", withdrawnAt: now, version: row.version + 1, updatedAt: new Date() })
            .where(and(eq(sightings.eventId, input.eventId), eq(sightings.id, rec.id)));
          await sp.insert(reviews).values({
            sightingId: rec.id,
            eventId: input.eventId,
            reviewerId: input.userId,
            fromState: state,
            toState: "rejected",
            reason: WITHDRAWN,
          });
        });
        acks.push({ kind: "sighting", id: rec.id, index, outcome: "updated", reviewState: "rejected" });
      } catch (err) {
        console.error("[sync] sighting not withdrawn", rec.id, (err as Error).message);
        acks.push(refused("sighting", index, rec.id, "store_failed", "(record)"));
      }
      continue;
    }
    const f = fields(rec);
    const changes = changedFields(row, rec, f);
    // An answer may change nothing but say something; a resent one finds the record pending.
    const freshAnswer = rec.answer && state === "returned" && rec.answer.toVersion === row.version;
    if (!changes.length && !freshAnswer) {
      acks.push({ kind: "sighting", id: rec.id, index, outcome: "already_had", reviewState: state });
      continue;
    }
    const change = rec.answer ?? rec.correction;
    if (!change) {
      acks.push(refused("sighting", index, rec.id, "changed_after_send", "id"));
      continue;
    }
    if (rec.answer && state !== "returned") {
      acks.push(refused("sighting", index, rec.id, "not_returned", "answer"));
      continue;
    }
    if (!rec.answer && (row.withdrawnAt || state === "rejected")) {
      acks.push(refused("sighting", index, rec.id, "not_correctable", "correction"));
      continue;
    }
    if (change.toVersion !== row.version) {
      const field = rec.answer ? "answer.toVersion" : "correction.toVersion";
      acks.push(refused("sighting", index, rec.id, "stale_version", field, { version: row.version }));
      continue;
    }
    try {
      await tx.transaction(async (sp) => {
        // The values it had are kept before they change (design.md "correction").
        if (changes.length)
          await sp.insert(sightingVersions).values({
            sightingId: rec.id,
            eventId: input.eventId,
            version: row.version,
            sessionId: row.sessionId,
            taxonId: row.taxonId,
            description: row.description,
            count: row.count,
            countIsEstimate: row.countIsEstimate,
            observedAt: row.observedAt,
            location: { longitude: Number(row.longitude), latitude: Number(row.latitude) },
            accuracyM: row.accuracyM,
            notes: row.notes,
          });
        await sp
          .update(sightings)
          .set({ ...f, reviewState: "pending", version: row.version + 1, updatedAt: new Date() })
          .where(and(eq(sightings.eventId, input.eventId), eq(sightings.id, rec.id)));
        const retaxon = row.taxonId !== f.taxonId;
        await sp.insert(reviews).values({
          sightingId: rec.id,
          eventId: input.eventId,
          reviewerId: input.userId,
          fromState: state,
          toState: "pending",
          fromTaxonId: retaxon ? row.taxonId : null,
          toTaxonId: retaxon ? f.taxonId : null,
          // A correction says what changed; an answer is the volunteer's own words.
          reason: rec.answer ? "" : CORRECTED,
          message: rec.answer ? rec.answer.message : changes.join("\n"),
        });
      });
      touched.push(rec.id);
      acks.push({ kind: "sighting", id: rec.id, index, outcome: "updated", reviewState: "pending" });
    } catch (err) {
      console.error("[sync] sighting not updated", rec.id, (err as Error).message);
      acks.push(refused("sighting", index, rec.id, "store_failed", "(record)"));
    }
  }
  // The reviewers' automatic hints, in the same transaction as the records themselves.
  await refreshCheckMarks(tx, touched, input.eventId);
  return acks;
}
