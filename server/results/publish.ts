import "server-only";
import { randomUUID } from "node:crypto";
import { enqueueMail, type OutboxMail } from "@/db/queries/mail-queue";
import { inReportTransaction, insertReport, latestReportInputs, reportRecipients } from "@/db/queries/reports";
import { loadEventInputs } from "@/db/queries/report-inputs";
import { loadResultsInput, pendingCounts, taxaMeta } from "@/db/queries/results";
import { env } from "@/lib/env";
import { toLocale, translator } from "@/lib/i18n/translator";
import type { Tx } from "@/db/client";
import { canonicalJson, computeResults, type Pending, type Results, type ResultsInput } from "@/lib/results/compute";
import { METHOD_NOTES } from "@/lib/results/methods";
import {
  diffColumns,
  inputFromColumns,
  inputHashOfColumns,
  recordsOfColumns,
  taxonIdsOf,
  type InputRecord,
  type ReportChanges,
} from "@/lib/results/records";
import { resultsWithBands } from "./current";
import { besideEarlierForReport } from "./compare-events";

/** Publishing while sightings wait for review needs `confirmPending` (the number is in the report). */
export class PendingRecordsError extends Error {
  constructor(readonly pending: Pending) {
    super("pending records");
  }
}

/** An input in one canonical form (counts by zone, then taxon): equal forms give equal results. */
export function inputKey(input: ResultsInput): string {
  const counts = [...input.counts].sort((a, b) =>
    a.zoneId < b.zoneId ? -1 : a.zoneId > b.zoneId ? 1 : a.taxon - b.taxon,
  );
  return canonicalJson({ ...input, counts });
}

/**
 * The next report version as publishing would freeze it, from one snapshot (`tx`): inputs,
 * results computed from exactly those inputs, and what changed since the previous version.
 * The preview shows this before anything is published (issue 16), through the same page.
 *
 * Speed (issue 18): the records are read (and, publishing, stored) by one statement while this
 * thread computes the results from the aggregate tables' input, or takes them from the results
 * page's own computation when that input is the same (resultsWithBands); The records' own input is then built and compared with
 * the one the results came from: when they differ (a sighting changed between the statements),
 * the results are computed again from the records. Hash, results input and changes are worked
 * out on the records' columns, never as a million arrays.
 */
export async function draftReport(eventId: string, tx: Tx, options: { storeFor?: string } = {}) {
  const pending = await pendingCounts(eventId, tx);
  const fromAggregates: ResultsInput = { ...(await loadResultsInput(eventId, { db: tx, pending: false })), pending };
  const inputsRead = loadEventInputs(eventId, tx, options);
  // A failure is met where it is awaited, after the computation below.
  inputsRead.catch(() => undefined);
  // The statement leaves before this thread is busy with the results.
  await new Promise((resolve) => setImmediate(resolve));
  const aggregateKey = inputKey(fromAggregates);
  const computed = resultsWithBands(eventId);
  let results: Results =
    computed && inputKey(computed.input) === aggregateKey
      ? (JSON.parse(computed.json) as Results)
      : computeResults(fromAggregates);
  const inputs = await inputsRead;
  const meta = await taxaMeta(taxonIdsOf(inputs), tx, eventId);
  const input = { ...inputFromColumns(inputs, fromAggregates.zones, meta), pending };
  if (inputKey(input) !== aggregateKey) results = computeResults(input);
  const prev = await latestReportInputs(eventId, tx);
  const version = (prev?.version ?? 0) + 1;
  let changes: ReportChanges | Record<string, never> = {};
  if (prev) {
    const names = new Map<string, string>([
      ...prev.results.species.map((s) => [s.id, s.scientificName] as const),
      ...[...meta.values()].map((t) => [t.id, t.scientificName] as const),
    ]);
    changes = diffColumns(prev.version, prev.inputs, inputs, (id) => names.get(id) ?? id);
  }
  // Beside the newest earlier event of the site, as it stands now (shown by the report, not re-computed).
  const besideEarlier = await besideEarlierForReport(eventId, tx);
  let records: InputRecord[] | undefined;
  return {
    pending,
    /** The records themselves, built when asked for (the preview lists them). */
    get records(): InputRecord[] {
      return (records ??= recordsOfColumns(inputs));
    },
    inputCount: inputs.n,
    results,
    version,
    changes,
    inputHash: inputHashOfColumns(inputs),
    besideEarlier,
  };
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
