import "server-only";
import { sql } from "drizzle-orm";
import type { ReviewState } from "@/lib/domain";
import { getDb } from "../client";
import type { users } from "../schema";

// Gathers review decisions into one digest mail per volunteer: a volunteer's waiting
// notices are composed once the oldest has waited `delaySeconds` (an hour by default), so
// decisions made close together arrive in one mail and no volunteer gets more than one
// digest per window. Composing and linking happen in one transaction with the outbox row;
// sending is the outbox's job (retried with back-off; the notices stay linked to it).

export type DigestItem = {
  reviewId: number;
  decidedAt: Date;
  fromState: ReviewState;
  toState: ReviewState;
  reason: string;
  message: string;
  fromTaxon: string | null;
  toTaxon: string | null;
  taxonChanged: boolean;
  count: number;
  observedAt: Date;
  eventName: string;
  timeZone: string;
  description: string;
};
export type DigestRecipient = Pick<typeof users.$inferSelect, "id" | "email" | "name" | "locale">;
export type RenderedMail = { subject: string; text: string; html: string };

export async function composeDigests(
  delaySeconds: number,
  render: (to: DigestRecipient, items: DigestItem[]) => RenderedMail,
): Promise<number> {
  const db = getDb();
  const { rows: due } = await db.execute<{ volunteerId: string }>(sql`
    SELECT volunteer_id AS "volunteerId" FROM review_notices WHERE digest_id IS NULL
      AND volunteer_id NOT IN (SELECT id FROM users WHERE erased_at IS NOT NULL) -- an erased account gets no mail
    GROUP BY volunteer_id HAVING min(created_at) <= now() - make_interval(secs => ${delaySeconds})`);
  let composed = 0;
  for (const { volunteerId } of due) {
    const made = await db.transaction(async (tx) => {
      // SKIP LOCKED: two workers never put one decision in two mails.
      const { rows: notices } = await tx.execute<{ reviewId: number }>(sql`
        SELECT review_id::int AS "reviewId" FROM review_notices WHERE volunteer_id = ${volunteerId} AND digest_id IS NULL
        ORDER BY review_id FOR UPDATE SKIP LOCKED`);
      if (!notices.length) return false;
      const ids = `{${notices.map((n) => n.reviewId).join(",")}}`;
      const { rows: person } = await tx.execute<DigestRecipient>(
        sql`SELECT id, email, name, locale FROM users WHERE id = ${volunteerId}`,
      );
      const to = person[0]!;
      const locale = to.locale.replace(/[^a-z]/g, "");
      const taxonName = (col: string) =>
        sql.raw(
          `(SELECT coalesce(coalesce((SELECT n.name FROM taxon_names n WHERE n.taxon_id = x.id AND n.locale = '${locale}'), (SELECT n.name FROM taxon_names n WHERE n.taxon_id = x.id AND n.locale = 'en')) || ' (' || x.scientific_name || ')', x.scientific_name) FROM taxa x WHERE x.id = ${col})`,
        );
      const { rows: items } = await tx.execute<DigestItem>(sql`
        SELECT r.id::int AS "reviewId", r.decided_at AS "decidedAt", r.from_state AS "fromState", r.to_state AS "toState", r.reason, r.message,
          ${taxonName("r.from_taxon_id")} AS "fromTaxon", ${taxonName("r.to_taxon_id")} AS "toTaxon",
          (r.from_taxon_id IS DISTINCT FROM r.to_taxon_id) AS "taxonChanged",
          s.count, s.observed_at AS "observedAt", s.description, e.name AS "eventName", e.time_zone AS "timeZone"
        FROM reviews r JOIN sightings s ON s.id = r.sighting_id AND s.event_id = r.event_id JOIN events e ON e.id = s.event_id
        WHERE r.id = ANY(${ids}::bigint[]) ORDER BY e.name, r.decided_at, r.id`);
      const mail = render(to, items);
      const { rows: outbox } = await tx.execute<{ id: number }>(sql`
        INSERT INTO email_outbox (to_address, kind, locale, subject, text_body, html_body)
        VALUES (${to.email}, 'review_digest', ${to.locale}, ${mail.subject}, ${mail.text}, ${mail.html}) RETURNING id::int AS id`);
      await tx.execute(
        sql`UPDATE review_notices SET digest_id = ${outbox[0]!.id} WHERE review_id = ANY(${ids}::bigint[])`,
      );
      return true;
    });
    if (made) composed++;
  }
  return composed;
}
