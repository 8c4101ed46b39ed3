import "server-only";
import { randomUUID } from "node:crypto";
import { enqueueMail, type OutboxMail } from "@/db/queries/mail-queue";
import { inReportTransaction, insertReport, latestReportInputs, reportRecipients } from "@/db/queries/reports";
import { loadEventInputRecords } from "@/db/queries/report-inputs";
import { eventZones, pendingCounts, taxaMeta } from "@/db/queries/results";
import { env } from "@/lib/env";
import { toLocale, translator } from "@/lib/i18n/translator";
import type { Tx } from "@/db/client";
import { canonicalJson, computeResults, type Pending } from "@/lib/results/compute";
import { METHOD_NOTES } from "@/lib/results/methods";
import { diffRecords, inputFromRecords, inputHash, type ReportChanges } from "@/lib/results/records";
import { besideEarlierForReport } from "./compare-events";

/** Publishing while sightings wait for review needs `confirmPending` (the number is in the report). */
export class PendingRecordsError extends Error {
  constructor(readonly pending: Pending) {
    super("pending records");
  }
}

/**
 * The next report version as publishing would freeze it, from one snapshot (`tx`): inputs,
 * results computed from exactly those inputs, and what changed since the previous version.
 * The preview shows this before anything is published (issue 16), through the same page.
 */
export async function draftReport(eventId: string, tx: Tx, options: { storeFor?: string } = {}) {
  const pending = await pendingCounts(eventId, tx);
  // Publishing stores the records as it reads them (report_inputs, under the new report's id).
  const records = await loadEventInputRecords(eventId, tx, options);
  const zones = await eventZones(eventId, tx);
  const meta = await taxaMeta([...new Set(records.map((r) => r[2]))], tx, eventId);
  const results = computeResults({ ...inputFromRecords(records, zones, meta), pending });
  const prev = await latestReportInputs(eventId, tx);
  const version = (prev?.version ?? 0) + 1;
  let changes: ReportChanges | Record<string, never> = {};
  if (prev) {
    const names = new Map<string, string>([
      ...prev.results.species.map((s) => [s.id, s.scientificName] as const),
      ...[...meta.values()].map((t) => [t.id, t.scientificName] as const),
    ]);
    changes = diffRecords(prev.version, prev.inputRecords, records, (id) => names.get(id) ?? id);
  }
  // Beside the newest earlier event of the site, as it stands now (shown by the report, not re-computed).
  const besideEarlier = await besideEarlierForReport(eventId, tx);
  return { pending, records, results, version, changes, inputHash: inputHash(records), besideEarlier };
}

/** The next version as the preview shows it, without publishing anything. */
export function previewReport(eventId: string) {
  return inReportTransaction(eventId, (tx) => draftReport(eventId, tx));
}

export const PUBLISH_NOTE_MAX = 2000;

/**
 * Freezes the event's current results into the next report version, in one transaction
 * under the event's report lock: inputs read in one snapshot, results computed from
 * exactly those inputs, what changed since the previous version, and the participants'
 * e-mails queued with the report (so a report is never published without its mails),
 * unless the organiser holds them back (`notify: false`). `note`: the organiser's optional
 * note, shown on the report page.
 */
export async function publishReport(
  eventId: string,
  userId: string,
  options: { confirmPending?: boolean; note?: string; notify?: boolean } = {},
): Promise<{ id: string; version: number }> {
  return inReportTransaction(eventId, async (tx) => {
    const reportId = randomUUID();
    const draft = await draftReport(eventId, tx, { storeFor: reportId });
    const { pending, results, version, changes } = draft;
    if (pending.pending + pending.returned > 0 && !options.confirmPending) throw new PendingRecordsError(pending);
    const id = await insertReport(
      {
        id: reportId,
        eventId,
        version,
        publishedBy: userId,
        engineVersion: results.engineVersion,
        inputHash: draft.inputHash,
        results: JSON.parse(canonicalJson(results)),
        methodNotes: METHOD_NOTES,
        changes,
        note: (options.note ?? "").trim(),
        besideEarlier: draft.besideEarlier,
      },
      tx,
    );
    if (options.notify !== false) {
      const people = await reportRecipients(eventId, tx);
      await enqueueMail(
        people.map((p) => publishMail({ version, eventName: p.eventName, eventSlug: p.eventSlug }, p)),
        tx,
      );
    }
    return { id, version };
  });
}

/** The e-mail every participant gets when a report version is published, in their language. */
export function publishMail(
  report: { version: number; eventName: string; eventSlug: string },
  person: { email: string; locale: string },
): OutboxMail {
  const locale = toLocale(person.locale);
  const t = translator(locale, "Results");
  const link = `${env().APP_URL}/${locale}/events/${report.eventSlug}/reports/${report.version}`;
  const values = { event: report.eventName, version: report.version, link };
  return {
    to: person.email,
    kind: "report_published",
    locale,
    subject: t("mail.subject", values),
    text: t("mail.text", values),
  };
}
