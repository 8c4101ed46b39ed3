import "server-only";
import { and, asc, eq, ne } from "drizzle-orm";
import { reviewClosesAt } from "@/lib/time/review-period";
import { getDb } from "../client";
import { eventMembers, events } from "../schema";

/** The events a person can open in the field log: those they are a member of, not drafts. */
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
    .where(and(eq(eventMembers.userId, userId), ne(events.status, "draft")))
    .orderBy(asc(events.status), asc(events.name));
  return rows.map((r) => ({
    ...r,
    startsAt: r.startsAt.toISOString(),
    endsAt: r.endsAt.toISOString(),
    reviewClosesAt: reviewClosesAt(r).toISOString(), // the organiser's date, or the default
  }));
}
