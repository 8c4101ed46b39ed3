import "server-only";
import type { z } from "zod";
import { ingestBatch, type Indexed, type StoreOutcome } from "@/db/queries/sync";
import { zodFieldProblems } from "@/lib/http/errors";
import { translator } from "@/lib/i18n/translator";
import type { Locale } from "@/lib/i18n/routing";
import type { RecordRef, SyncAck } from "@/lib/sync/acks";
import {
  sessionRecord,
  sightingRecord,
  type SessionRecord,
  type SightingRecord,
  type SyncBatch,
} from "@/lib/sync/records";

// The sync handler's work after the guard (app/api/events/[eventId]/sync/route.ts): each
// record of the batch is parsed on its own with the contract's schemas, the data layer
// stores the good ones and answers with codes, and every outcome becomes an
// acknowledgement with its reason in the person's language. Acks come in batch order:
// sessions, then sightings, each by index.

export type SyncCaller = { userId: string; eventId: string; locale: Locale; now?: Date };

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** A record that failed its schema, named by its id when that much is readable. */
function readableId(raw: unknown): string | null {
  const id = (raw as { id?: unknown } | null)?.id;
  return typeof id === "string" && UUID.test(id) ? id.toLowerCase() : null;
}

type Unparsed = RecordRef & { error: z.ZodError };

function parseEach<R>(kind: RecordRef["kind"], raws: unknown[], schema: z.ZodType<R>) {
  const good: Indexed<R>[] = [];
  const bad: Unparsed[] = [];
  raws.forEach((raw, index) => {
    const parsed = schema.safeParse(raw);
    if (parsed.success) good.push({ index, record: parsed.data });
    else bad.push({ kind, index, id: readableId(raw), error: parsed.error });
  });
  return { good, bad };
}

/**
 * Answers one batch for a person the caller has already let in (a member of the event,
 * volunteer or above: requireEventRole). Never throws for a bad record.
 */
export async function answerBatch(caller: SyncCaller, batch: SyncBatch): Promise<SyncAck[]> {
  const t = translator(caller.locale, "FieldSync");
  const sessions = parseEach<SessionRecord>("session", batch.sessions, sessionRecord);
  const sightings = parseEach<SightingRecord>("sighting", batch.sightings, sightingRecord);
  const stored = await ingestBatch({
    userId: caller.userId,
    eventId: caller.eventId,
    sessions: sessions.good,
    sightings: sightings.good,
    now: caller.now,
  });

  const fromSchema = (u: Unparsed): SyncAck => {
    const [problem] = zodFieldProblems(u.error, caller.locale);
    return {
      kind: u.kind,
      id: u.id,
      index: u.index,
      outcome: "refused",
      reason: problem?.message ?? t("reason.store_failed"),
      field: problem?.field ?? "(record)",
    };
  };
  const fromStore = (o: StoreOutcome): SyncAck => {
    if (o.outcome === "refused")
      return {
        kind: o.kind,
        id: o.id,
        index: o.index,
        outcome: "refused",
        reason: t(`reason.${o.code}`, o.values ?? {}),
        field: o.field,
      };
    return {
      kind: o.kind,
      id: o.id,
      index: o.index,
      outcome: o.outcome,
      ...(o.reviewState ? { reviewState: o.reviewState } : {}),
    };
  };
  const acks = [...sessions.bad.map(fromSchema), ...sightings.bad.map(fromSchema), ...stored.map(fromStore)];
  const order = (a: SyncAck) => (a.kind === "session" ? 0 : 1);
  return acks.sort((a, b) => order(a) - order(b) || a.index - b.index);
}
