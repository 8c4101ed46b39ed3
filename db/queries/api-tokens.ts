import "server-only";
import { sql } from "drizzle-orm";
import { getDb } from "../client";

// Read-only API tokens (issue 19): the rows, the per-call check, and what a token may read.
// The secret itself is never stored or returned here: callers pass its SHA-256.

export type ApiTokenSummary = {
  id: string;
  name: string;
  prefix: string;
  scope: "event" | "organisation";
  eventId: string | null;
  eventName: string | null;
  createdAt: Date;
  createdByName: string | null;
  expiresAt: Date;
  revokedAt: Date | null;
  lastUsedAt: Date | null;
};

export type NewApiToken = {
  organisationId: string;
  eventId: string | null;
  name: string;
  prefix: string;
  tokenHash: string;
  createdBy: string;
  expiresAt: Date;
};

export async function createApiToken(t: NewApiToken): Promise<{ id: string; createdAt: Date }> {
  const r = await getDb().execute<{ id: string; createdAt: string }>(sql`
    INSERT INTO api_tokens (organisation_id, event_id, name, prefix, token_hash, created_by, expires_at)
    VALUES (${t.organisationId}, ${t.eventId}, ${t.name}, ${t.prefix}, ${t.tokenHash}, ${t.createdBy}, ${t.expiresAt.toISOString()})
    RETURNING id, created_at AS "createdAt"`);
  const row = r.rows[0]!;
  return { id: row.id, createdAt: new Date(row.createdAt) };
}

const summaryColumns = sql`
  a.id, a.name, a.prefix, CASE WHEN a.event_id IS NULL THEN 'organisation' ELSE 'event' END AS scope,
  a.event_id AS "eventId", e.name AS "eventName", a.created_at AS "createdAt", u.name AS "createdByName",
  a.expires_at AS "expiresAt", a.revoked_at AS "revokedAt", a.last_used_at AS "lastUsedAt"`;

function summary(row: Record<string, unknown>): ApiTokenSummary {
  const date = (v: unknown) => (v == null ? null : new Date(v as string));
  return {
    ...(row as Omit<ApiTokenSummary, "createdAt" | "expiresAt" | "revokedAt" | "lastUsedAt">),
    createdAt: date(row.createdAt)!,
    expiresAt: date(row.expiresAt)!,
    revokedAt: date(row.revokedAt),
    lastUsedAt: date(row.lastUsedAt),
  };
}

/**
 * Tokens an organiser of `eventId` sees on its setup screen: the event's own, and, when
 * `withOrganisation`, the organisation-wide ones. Newest first; revoked ones stay listed.
 */
export async function listApiTokens(eventId: string, withOrganisation: boolean): Promise<ApiTokenSummary[]> {
  const r = await getDb().execute<Record<string, unknown>>(sql`
    SELECT ${summaryColumns}
    FROM api_tokens a LEFT JOIN events e ON e.id = a.event_id LEFT JOIN users u ON u.id = a.created_by
    WHERE a.event_id = ${eventId}
       OR (${withOrganisation} AND a.event_id IS NULL AND a.organisation_id = (SELECT organisation_id FROM events WHERE id = ${eventId}))
    ORDER BY a.created_at DESC, a.id`);
  return r.rows.map(summary);
}

/** The token as the setup screen sees it (for the revoke handler's scope check). */
export async function getApiToken(id: string): Promise<(ApiTokenSummary & { organisationId: string }) | null> {
  if (!/^[0-9a-f-]{36}$/i.test(id)) return null;
  const r = await getDb().execute<Record<string, unknown>>(sql`
    SELECT ${summaryColumns}, a.organisation_id AS "organisationId"
    FROM api_tokens a LEFT JOIN events e ON e.id = a.event_id LEFT JOIN users u ON u.id = a.created_by WHERE a.id = ${id}`);
  const row = r.rows[0];
  return row ? { ...summary(row), organisationId: row.organisationId as string } : null;
}

/** Revokes a token once; a second revoke changes nothing ("already"). */
export async function revokeApiToken(id: string, userId: string): Promise<"ok" | "already"> {
  const r = await getDb().execute(sql`
    UPDATE api_tokens SET revoked_at = now(), revoked_by = ${userId} WHERE id = ${id} AND revoked_at IS NULL`);
  return r.rowCount ? "ok" : "already";
}

export type TokenUse =
  | { outcome: "ok"; token: { id: string; organisationId: string; eventId: string | null } }
  | { outcome: "rate_limited"; retryAfterSeconds: number }
  | { outcome: "refused" };

/**
 * One call with a token: refused unless it exists, is not revoked and has not expired.
 * Records the last use and counts the call in the token's fixed window, in one UPDATE
 * (so two instances cannot both let the limit's last call through).
 */
export async function recordApiTokenCall(
  tokenHash: string,
  limit: { calls: number; windowSeconds: number },
): Promise<TokenUse> {
  const r = await getDb().execute<{
    id: string;
    organisationId: string;
    eventId: string | null;
    calls: number;
    retryAfter: number;
  }>(sql`
    WITH w AS (
      SELECT id, window_started_at IS NULL OR window_started_at <= now() - make_interval(secs => ${limit.windowSeconds}) AS fresh
      FROM api_tokens WHERE token_hash = ${tokenHash} AND revoked_at IS NULL AND expires_at > now()
      FOR UPDATE
    )
    UPDATE api_tokens a SET
      last_used_at = now(),
      window_started_at = CASE WHEN w.fresh THEN now() ELSE a.window_started_at END,
      window_calls = CASE WHEN w.fresh THEN 1 ELSE a.window_calls + 1 END
    FROM w WHERE a.id = w.id
    RETURNING a.id, a.organisation_id AS "organisationId", a.event_id AS "eventId", a.window_calls AS calls,
      greatest(1, ceil(extract(epoch FROM a.window_started_at + make_interval(secs => ${limit.windowSeconds}) - now())))::int AS "retryAfter"`);
  const row = r.rows[0];
  if (!row) return { outcome: "refused" };
  if (row.calls > limit.calls) return { outcome: "rate_limited", retryAfterSeconds: row.retryAfter };
  return { outcome: "ok", token: { id: row.id, organisationId: row.organisationId, eventId: row.eventId } };
}

export type ApiEvent = {
  id: string;
  slug: string;
  name: string;
  status: string;
  startsAt: Date;
  endsAt: Date;
  timeZone: string;
};

/** Events a token may read: its event, or every event of its organisation. */
export async function apiEvents(token: { organisationId: string; eventId: string | null }): Promise<ApiEvent[]> {
  const r = await getDb().execute<ApiEvent>(sql`
    SELECT id, slug, name, status::text AS status, starts_at AS "startsAt", ends_at AS "endsAt", time_zone AS "timeZone"
    FROM events WHERE organisation_id = ${token.organisationId} AND (${token.eventId}::uuid IS NULL OR id = ${token.eventId})
    ORDER BY starts_at DESC, id`);
  return r.rows.map((e) => ({ ...e, startsAt: new Date(e.startsAt), endsAt: new Date(e.endsAt) }));
}

/** The event's organisation and name, or null for an unknown event. */
export async function eventOwner(eventId: string): Promise<{ organisationId: string; name: string } | null> {
  if (!/^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i.test(eventId)) return null;
  const r = await getDb().execute<{ organisationId: string; name: string }>(sql`
    SELECT organisation_id AS "organisationId", name FROM events WHERE id = ${eventId}`);
  return r.rows[0] ?? null;
}

export type ApiSighting = {
  id: string;
  observedAt: Date;
  lon: number;
  lat: number;
  accuracyM: number;
  taxonId: string;
  count: number;
  sensitivity: "open" | "generalised" | "restricted";
  scientificName: string;
  rank: string;
  names: Record<string, string>;
  /** The name the recorder chose to publish, else an anonymous recorder id; never an e-mail (as the archive). */
  recordedBy: string;
  /** Last change, in microseconds since 1970 (PostgreSQL's own precision, for the cursor). */
  modifiedMicros: string;
  modifiedAt: Date;
};

/**
 * One page of the event's approved, identified sightings in order of their last change
 * (then id): `since` keeps those changed at or after it, `after` continues after the
 * last row of the previous page. Exact locations: the caller generalises or withholds.
 */
export async function approvedSightingsPage(
  eventId: string,
  options: { since?: Date; after?: { micros: string; id: string }; limit: number },
): Promise<ApiSighting[]> {
  const since = options.since ? sql`AND s.updated_at >= ${options.since.toISOString()}::timestamptz` : sql``;
  const after = options.after
    ? sql`AND (s.updated_at, s.id) > (timestamptz 'epoch' + ${options.after.micros}::bigint * interval '1 microsecond', ${options.after.id}::uuid)`
    : sql``;
  const r = await getDb().execute<
    Omit<ApiSighting, "observedAt" | "modifiedAt"> & { observedAt: string; modifiedAt: string }
  >(sql`
    SELECT s.id, s.observed_at AS "observedAt", ST_X(s.location) AS lon, ST_Y(s.location) AS lat, s.accuracy_m::float8 AS "accuracyM",
      s.taxon_id AS "taxonId", s.count, t.sensitivity::text AS sensitivity, t.scientific_name AS "scientificName", t.rank::text AS rank,
      coalesce((SELECT jsonb_object_agg(n.locale, n.name) FROM taxon_names n WHERE n.taxon_id = t.id), '{}'::jsonb) AS names,
      ((extract(epoch FROM s.updated_at) * 1000000)::bigint)::text AS "modifiedMicros", s.updated_at AS "modifiedAt",
      coalesce(u.published_name, 'recorder-' || left(md5(u.id::text), 8)) AS "recordedBy"
    FROM sightings s JOIN taxa t ON t.id = s.taxon_id JOIN users u ON u.id = s.user_id
    WHERE s.event_id = ${eventId} AND s.review_state = 'approved' ${since} ${after}
    ORDER BY s.updated_at, s.id
    LIMIT ${options.limit}`);
  return r.rows.map((x) => ({ ...x, observedAt: new Date(x.observedAt), modifiedAt: new Date(x.modifiedAt) }));
}

/**
 * Sightings of the event changed at or after `since` that are no longer approved but once
 * were (rejected, returned after approval): an incremental pull must drop them. Oldest change first.
 */
export async function withdrawnSince(eventId: string, since: Date, limit: number): Promise<string[]> {
  const r = await getDb().execute<{ id: string }>(sql`
    SELECT s.id FROM sightings s
    WHERE s.event_id = ${eventId} AND s.updated_at >= ${since.toISOString()}::timestamptz AND s.review_state <> 'approved'
      AND EXISTS (SELECT 1 FROM reviews r WHERE r.sighting_id = s.id AND r.event_id = s.event_id AND r.to_state = 'approved')
    ORDER BY s.updated_at, s.id
    LIMIT ${limit}`);
  return r.rows.map((x) => x.id);
}

/** A published report without its input records (which name every sighting). */
export async function publishedReport(eventId: string, version: number) {
  const r = await getDb().execute<{
    id: string;
    version: number;
    publishedAt: string;
    engineVersion: string;
    inputHash: string;
    results: unknown;
    methodNotes: unknown;
    changes: unknown;
    latestVersion: number;
    withdrawnAt: string | null;
    withdrawReason: string | null;
  }>(sql`
    SELECT id, version, published_at AS "publishedAt", engine_version AS "engineVersion", input_hash AS "inputHash",
      results, method_notes AS "methodNotes", changes,
      (SELECT max(version) FROM reports x WHERE x.event_id = reports.event_id)::int AS "latestVersion",
      w.withdrawn_at AS "withdrawnAt", w.reason AS "withdrawReason"
    FROM reports LEFT JOIN report_withdrawals w ON w.report_id = reports.id
    WHERE event_id = ${eventId} AND version = ${version}`);
  const row = r.rows[0];
  return row
    ? {
        ...row,
        publishedAt: new Date(row.publishedAt),
        withdrawnAt: row.withdrawnAt ? new Date(row.withdrawnAt) : null,
      }
    : null;
}
