import { approvedSightingsPage, eventOwner, withdrawnSince } from "@/db/queries/api-tokens";
import { ApiError, apiTranslator, handle, parseQuery, requestLocale } from "@/lib/http/errors";
import { isUuid, parseParams } from "@/lib/http/params";
import { csvField, dwcRecord, DWC_TERMS, publicOccurrences } from "@/lib/results/exports";
import { requireApiToken } from "@/server/auth/guard";
import { readOnly } from "../../../read-only";
import { eventIdParams } from "../../../schema";
import { dwcOccurrence, sightingsQuery, type SightingsPage } from "./schema";

export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ eventId: string }> };

// Withdrawals listed on an incremental pull's first page; a pull since long ago that
// would list more should start afresh without since= (an upper bound, common practice).
const WITHDRAWN_MAX = 10_000;

// The cursor is the last row's change time (microseconds) and id, so a page costs the
// same at any depth and rows changed during a pull are met again later, never skipped.
function encodeCursor(micros: string, id: string): string {
  return Buffer.from(`${micros}.${id}`, "utf8").toString("base64url");
}
function decodeCursor(cursor: string): { micros: string; id: string } | null {
  const m = /^(\d{1,20})\.(.+)$/.exec(Buffer.from(cursor, "base64url").toString("utf8"));
  return m && isUuid(m[2]!) ? { micros: m[1]!, id: m[2]!.toLowerCase() } : null;
}

/**
 * The event's approved sightings as Darwin Core, in order of their last change. Sensitive
 * taxa exactly as in the public downloads (lib/results/exports.ts): generalised ones on a
 * 0.1° grid, restricted ones left out (and counted in `withheld`).
 */
export const GET = handle(async (request, { params }: Ctx) => {
  // A malformed address is a 404 for everyone (the one path-parameter rule), then the token.
  const { eventId } = await parseParams(params, eventIdParams.shape);
  await requireApiToken(request, { eventId });
  const q = parseQuery(request, sightingsQuery);
  const locale = requestLocale(request);
  const after = q.cursor ? decodeCursor(q.cursor) : undefined;
  if (after === null)
    throw new ApiError("bad_request", [{ field: "cursor", message: apiTranslator(locale)("field.invalid") }]);
  const rows = await approvedSightingsPage(eventId, {
    since: q.since ? new Date(q.since) : undefined,
    after,
    limit: q.limit + 1,
  });
  const page = rows.slice(0, q.limit);
  const last = page.at(-1);
  const nextCursor = rows.length > q.limit && last ? encodeCursor(last.modifiedMicros, last.id) : null;
  const event = (await eventOwner(eventId))!;
  const species = page.map((r) => ({ id: r.taxonId, scientificName: r.scientificName, rank: r.rank, names: r.names }));
  const { rows: located, withheld } = publicOccurrences({ species }, page, locale);
  const modified = new Map(page.map((r) => [r.id, r.modifiedAt.toISOString()]));
  // Parsed with the schema the OpenAPI document is made from, so the two cannot drift apart.
  const records = located.map((r) =>
    dwcOccurrence.parse({ ...dwcRecord(r, event.name), modified: modified.get(r.id)! }),
  );
  const modifiedUntil = last ? last.modifiedAt.toISOString() : null;

  if (q.format === "csv") {
    const header = [...DWC_TERMS, "modified"] as const;
    const csv =
      [header.join(","), ...records.map((r) => header.map((t) => csvField(r[t])).join(","))].join("\r\n") + "\r\n";
    const headers: Record<string, string> = {
      "Content-Type": "text/csv; charset=utf-8",
      "Cache-Control": "no-store",
      "X-Withheld": String(withheld),
    };
    if (nextCursor) {
      const next = new URL(request.url);
      next.searchParams.set("cursor", nextCursor);
      headers["X-Next-Cursor"] = nextCursor;
      headers["Link"] = `<${next.pathname}${next.search}>; rel="next"`;
    }
    if (modifiedUntil) headers["X-Modified-Until"] = modifiedUntil;
    return new Response(csv, { headers });
  }
  const withdrawn =
    q.since && !q.cursor
      ? (await withdrawnSince(eventId, new Date(q.since), WITHDRAWN_MAX)).map((id) => `urn:uuid:${id}`)
      : [];
  const body: SightingsPage = {
    event: { id: eventId, name: event.name },
    records,
    withheld,
    withdrawn,
    nextCursor,
    modifiedUntil,
  };
  return Response.json(body, { headers: { "Cache-Control": "no-store" } });
});

export { readOnly as POST, readOnly as PUT, readOnly as PATCH, readOnly as DELETE };
