import "server-only";
import { and, desc, eq, sql } from "drizzle-orm";
import type { MySighting } from "@/lib/sync/mine";
import { getDb } from "../client";
import { photos, reviews, sightings, taxa } from "../schema";

// A volunteer's own sightings at one event with their review state (the field log's "sent"
// list): for returned ones the coordinator's question, for rejected ones the reason. The
// row shape is the sync contract's (lib/sync/mine.ts).

const latest = (state: "returned" | "rejected", column: typeof reviews.message | typeof reviews.reason) => sql<
  string | null
>`(
  SELECT r.${sql.identifier(column.name)} FROM ${reviews} r WHERE r.sighting_id = ${sightings.id} AND r.event_id = ${sightings.eventId} AND r.to_state = ${state}
  ORDER BY r.decided_at DESC, r.id DESC LIMIT 1)`;

export async function listMySightings(userId: string, eventId: string): Promise<MySighting[]> {
  const rows = await getDb()
    .select({
      id: sightings.id,
      version: sightings.version,
      reviewState: sightings.reviewState,
      taxonId: sightings.taxonId,
      scientificName: taxa.scientificName,
      description: sightings.description,
      count: sightings.count,
      countIsEstimate: sightings.countIsEstimate,
      observedAt: sightings.observedAt,
      latitude: sql<number>`ST_Y(${sightings.location})`,
      longitude: sql<number>`ST_X(${sightings.location})`,
      accuracyM: sightings.accuracyM,
      zoneId: sightings.zoneId,
      sessionId: sightings.sessionId,
      notes: sightings.notes,
      photoIds: sql<
        string[]
      >`coalesce((SELECT array_agg(p.id::text ORDER BY p.created_at, p.id) FROM ${photos} p WHERE p.sighting_id = ${sightings.id} AND p.event_id = ${sightings.eventId}), ARRAY[]::text[])`,
      question: sql<
        string | null
      >`CASE WHEN ${sightings.reviewState} = 'returned' THEN ${latest("returned", reviews.message)} END`,
      rejectionReason: sql<
        string | null
      >`CASE WHEN ${sightings.reviewState} = 'rejected' THEN ${latest("rejected", reviews.reason)} END`,
      withdrawn: sql<boolean>`${sightings.withdrawnAt} IS NOT NULL`,
      updatedAt: sightings.updatedAt,
    })
    .from(sightings)
    .leftJoin(taxa, eq(taxa.id, sightings.taxonId))
    .where(and(eq(sightings.userId, userId), eq(sightings.eventId, eventId)))
    .orderBy(desc(sightings.observedAt), desc(sightings.id));
  return rows.map((r) => ({ ...r, observedAt: r.observedAt.toISOString(), updatedAt: r.updatedAt.toISOString() }));
}
