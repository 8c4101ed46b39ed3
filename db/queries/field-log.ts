import "server-only";
import { asc, eq, sql } from "drizzle-orm";
import { reviewClosesAt } from "@/lib/time/review-period";
import { getDb } from "../client";
import { eventMembers, events } from "../schema";

/**
 * The events a person can open in the field log: those they are a member of, open ones first.
 * A draft is listed too (someone who joined early sees when recording opens), and takes no records.
 */
export async function fieldLogEvents(userId: string) {
  const rows = await getDb()
    .select({
      id: events.id,
      name: events.name,
      status: events.status,
      timeZone: events.timeZone,
      startsAt: events.startsAt,
      endsAt: events.endsAt,
      reviewClosesAt: events.reviewClosesAt,
    })
    .from(eventMembers)
    .innerJoin(events, eq(events.id, eventMembers.eventId))
    .where(eq(eventMembers.userId, userId))
    .orderBy(sql`CASE ${events.status} WHEN 'open' THEN 0 WHEN 'draft' THEN 1 ELSE 2 END`, asc(events.name));
  return rows.map((r) => ({
    ...r,
    startsAt: r.startsAt.toISOString(),
    endsAt: r.endsAt.toISOString(),
    reviewClosesAt: reviewClosesAt(r).toISOString(), // the organiser's date, or the default
  }));
}
