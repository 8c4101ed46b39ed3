import { getFormatter, getTranslations } from "next-intl/server";
import { eventLatitude } from "@/db/queries/events";
import { eventCredits, publicResultsOf, reportOccurrences, type Withdrawal } from "@/db/queries/reports";
import { areaAndZones } from "@/db/queries/setup-zones";
import { MapSettingsProvider } from "@/components/map/map-settings";
import { RealMap } from "@/components/map/real-map";
import type { ArealGeometry } from "@/lib/geo/areal";
import { GRID_DEGREES, gridCellKm, publicOccurrences } from "@/lib/results/exports";
import { reportMapLayers } from "@/lib/results/report-map";
import { mapSettings } from "@/server/map-settings";
import { checkReport } from "@/server/results/check";
import { ResultsBody } from "@/components/results/results-body";
import { EventsComparison } from "@/components/results/events-comparison";
import type { ReportBesideEarlier } from "@/lib/results/compare-events";
import { EstimateCaution } from "@/components/results/zone-comparison";
import { LocaleLink as Link } from "@/components/locale-link";
import type { Results } from "@/lib/results/compute";
import type { METHOD_NOTES } from "@/lib/results/methods";
import type { InputRecord, ReportChanges } from "@/lib/results/records";
import { blockLead } from "@/lib/results/live";
import { HILL_BOOTSTRAP_REPLICATES } from "@/lib/diversity/index";

/** A published version, or the next one as the preview computes it (id null: nothing published yet). */
export type ReportLike = {
  id: string | null;
  version: number;
  latestVersion: number;
  publishedAt: Date;
  engineVersion: string;
  inputHash: string;
  inputCount: number;
  inputRecords: InputRecord[];
  results: Results;
  methodNotes: typeof METHOD_NOTES;
  changes: ReportChanges | Record<string, never>;
  note: string;
  withdrawal: Withdrawal | null;
  /** Beside an earlier event of the site, as it stood at publishing (absent or null: none). */
  besideEarlier?: ReportBesideEarlier | null;
};

export type ReportEventLike = { id: string; name: string; slug: string; timeZone: string; organisationName: string };

/**
 * The report page's body: the public version page and the organiser's preview render this one
 * component, so the preview shows exactly what the public will read (issue 16). In a preview the
 * downloads and the re-computation check wait for publishing.
 */
export async function ReportView({
  event,
  report,
  locale,
  wantCheck = false,
  preview = false,
}: {
  event: ReportEventLike;
  report: ReportLike;
  locale: string;
  wantCheck?: boolean;
  preview?: boolean;
}) {
  const slug = event.slug;
  const [t, tMap, format, credits, latitude, check, r, shapes, occurrences] = await Promise.all([
    getTranslations("Report"),
    getTranslations("Map"),
    getFormatter(),
    eventCredits(event.id),
    eventLatitude(event.id),
    wantCheck && !preview ? checkReport(event.id, report.version) : Promise.resolve(null),
    // Sensitive taxa never by zone, restricted ones hidden if the organiser chose so (lib/results/public.ts).
    publicResultsOf(event.id, report.results),
    areaAndZones(event.id),
    reportOccurrences({ ...report, eventId: event.id }),
  ]);
  // The same estimate the results page and the live board show (lib/results/live.ts).
  const lead = blockLead(r.event);
  const q1 = r.event.abundance?.hill.q1 ?? null;
  const tResults = await getTranslations("Results");
  // The map shows what the downloads publish: restricted records withheld, generalised ones as their cell.
  const layers = reportMapLayers(publicOccurrences(report.results, occurrences, locale).rows);
  const n = (v: number, d = 1) => (Number.isFinite(v) ? format.number(v, { maximumFractionDigits: d }) : "–");
  const changes = report.changes as ReportChanges;
  const files = [
    { file: "species.csv", label: t("downloads.csv") },
    { file: "darwin-core-archive.zip", label: t("downloads.dwca") },
    { file: "sightings.geojson", label: t("downloads.geojson") },
  ];
  return (
    <article className="space-y-8">
      <header className="space-y-2">
        <h1 className="text-3xl font-bold text-reed-900">
          {t("title", { event: event.name, version: report.version })}
        </h1>
        <p className="text-ink-soft">
          {t("published", {
            date: format.dateTime(report.publishedAt, {
              dateStyle: "long",
              timeStyle: "short",
              timeZone: event.timeZone,
            }),
            timeZone: event.timeZone,
          })}
        </p>
        {report.note ? (
          <p className="max-w-prose rounded-lg border border-reed-200 bg-white/70 p-3" data-testid="report-note">
            <span className="font-semibold">{t("note")}</span> {report.note}
          </p>
        ) : null}
        {report.withdrawal ? (
          <div
            role="note"
            aria-labelledby="withdrawn-title"
            className="space-y-1 rounded-lg border-2 border-signal bg-signal-soft p-3"
            data-testid="withdrawn"
          >
            <p id="withdrawn-title" className="text-lg font-bold">
              {t("withdrawn.title")}
            </p>
            <p>
              {t("withdrawn.body", {
                date: format.dateTime(report.withdrawal.withdrawnAt, {
                  dateStyle: "long",
                  timeStyle: "short",
                  timeZone: event.timeZone,
                }),
                reason: report.withdrawal.reason,
              })}
            </p>
            <p>{t("withdrawn.data")}</p>
          </div>
        ) : null}
        {report.version > 1 || report.version < report.latestVersion ? (
          <nav aria-label={t("versionNav")} className="flex flex-wrap gap-4">
            {report.version > 1 ? (
              <Link href={`/events/${slug}/reports/${report.version - 1}`} className="font-semibold underline">
                {t("previousVersion", { version: report.version - 1 })}
              </Link>
            ) : null}
            {report.version < report.latestVersion ? (
              <Link href={`/events/${slug}/reports/${report.version + 1}`} className="font-semibold underline">
                {t("nextVersion", { version: report.version + 1 })}
              </Link>
            ) : null}
          </nav>
        ) : null}
        {report.version < report.latestVersion ? (
          <p
            role="note"
            className="rounded-lg border-2 border-signal bg-signal-soft p-3 font-semibold"
            data-testid="superseded"
          >
            {t("superseded")}{" "}
            <Link href={`/events/${slug}/reports/${report.latestVersion}`} className="underline">
              {t("latest", { version: report.latestVersion })}
            </Link>
          </p>
        ) : null}
      </header>

      {report.version > 1 && changes.previousVersion ? (
        <section aria-labelledby="changes-title" className="space-y-2" data-testid="changes">
          <h2 id="changes-title" className="text-2xl font-bold text-reed-900">
            {t("changes.title", { previous: changes.previousVersion })}
          </h2>
          <ul className="list-disc ps-5">
            <li>
              {t("changes.records", { added: changes.added, removed: changes.removed, changed: changes.changed })}
            </li>
            <li>{t("changes.species", { before: changes.speciesBefore, after: changes.speciesAfter })}</li>
            <li>{t("changes.individuals", { before: changes.individualsBefore, after: changes.individualsAfter })}</li>
            {changes.newTaxa.length ? <li>{t("changes.newTaxa", { taxa: changes.newTaxa.join(", ") })}</li> : null}
            {changes.lostTaxa.length ? <li>{t("changes.lostTaxa", { taxa: changes.lostTaxa.join(", ") })}</li> : null}
          </ul>
        </section>
      ) : null}

      <section aria-labelledby="headline-title" className="space-y-2">
        <h2 id="headline-title" className="text-2xl font-bold text-reed-900">
          {t("headline.title")}
        </h2>
        <dl className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
          <div className="rounded-lg border border-reed-200 bg-white/70 p-3">
            <dt>{t("headline.observed")}</dt>
            <dd className="text-2xl font-bold" data-testid="headline-observed">
              {r.event.observed}
            </dd>
          </div>
          {lead.richness ? (
            <div className="rounded-lg border border-reed-200 bg-white/70 p-3">
              <dt>{t("headline.estimate", { estimator: lead.richness.estimator === "chao1" ? "Chao1" : "Chao2" })}</dt>
              <dd className="text-2xl font-bold">{n(lead.richness.estimate)}</dd>
              <dd className="text-sm">
                {t("headline.intervalNamed", {
                  method: tResults("interval.logNormal"),
                  lower: n(lead.richness.lower),
                  upper: n(lead.richness.upper),
                })}
              </dd>
            </div>
          ) : (
            <div className="rounded-lg border-2 border-signal bg-signal-soft p-3">
              <dt>{t("headline.tooFew")}</dt>
            </div>
          )}
          {lead.coverage !== null ? (
            <div className="rounded-lg border border-reed-200 bg-white/70 p-3">
              <dt>{t(lead.coverageKind === "incidence" ? "headline.coverageIncidence" : "headline.coverageSample")}</dt>
              <dd className="text-2xl font-bold">
                {format.number(lead.coverage, { style: "percent", maximumFractionDigits: 1 })}
              </dd>
            </div>
          ) : null}
          {q1 ? (
            <div className="rounded-lg border border-reed-200 bg-white/70 p-3">
              <dt>{t("headline.hill1")}</dt>
              <dd className="text-2xl font-bold">{n(q1.estimate)}</dd>
              <dd className="text-sm">
                {t("headline.intervalNamed", {
                  method: tResults("interval.bootstrap", { replicates: HILL_BOOTSTRAP_REPLICATES }),
                  lower: n(q1.lower),
                  upper: n(q1.upper),
                })}
              </dd>
            </div>
          ) : null}
        </dl>
      </section>

      <EstimateCaution />
      <aside className="rounded-lg border-2 border-heath-500 bg-heath-50 p-3">
        <p className="font-bold text-heath-900">{t("sensitive.title")}</p>
        <p>
          {latitude === null
            ? t("sensitive.bodyNoPlace", {
                northSouth: format.number(gridCellKm(0).northSouth, { maximumFractionDigits: 0 }),
              })
            : t("sensitive.body", {
                northSouth: format.number(gridCellKm(latitude).northSouth, { maximumFractionDigits: 0 }),
                eastWest: format.number(gridCellKm(latitude).eastWest, { maximumFractionDigits: 1 }),
              })}
        </p>
      </aside>

      <section aria-labelledby="report-map-title" className="space-y-2">
        <h2 id="report-map-title" className="text-2xl font-bold text-reed-900">
          {tMap("reportTitle")}
        </h2>
        <MapSettingsProvider settings={mapSettings()}>
          <RealMap
            label={tMap("reportLabel")}
            area={shapes.area as ArealGeometry | null}
            zones={shapes.zones.map((z) => ({ id: z.id, name: z.name, geometry: z.geometry as ArealGeometry }))}
            markers={layers.points}
            cells={layers.cells.map((c) => ({
              id: c.id,
              label: tMap("cellLabel", { names: c.names.join(", ") }),
              geometry: c.geometry,
            }))}
            className="h-96 w-full rounded-lg border border-reed-200"
            onRequest
          />
        </MapSettingsProvider>
        <p className="text-sm text-ink-soft">{tMap("reportLegend", { size: GRID_DEGREES })}</p>
      </section>

      <section aria-labelledby="downloads-title" className="space-y-2">
        <h2 id="downloads-title" className="text-2xl font-bold text-reed-900">
          {t("downloads.title")}
        </h2>
        {preview || !report.id ? <p>{t("preview.downloadsLater")}</p> : null}
        <ul className="flex flex-wrap gap-3">
          {(preview || !report.id ? [] : files).map((f) => (
            <li key={f.file}>
              <a
                href={`/api/reports/${report.id}/${f.file}`}
                download
                className="inline-flex min-h-touch items-center rounded-lg border-2 border-reed-700 px-4 font-semibold text-reed-800"
              >
                {f.label}
              </a>
            </li>
          ))}
        </ul>
      </section>

      <ResultsBody results={r} showSensitivity />
      {report.besideEarlier ? (
        <EventsComparison
          candidates={[]}
          chosen={report.besideEarlier.earlier}
          comparison={report.besideEarlier.comparison}
        />
      ) : null}

      <section aria-labelledby="method-title" className="space-y-2">
        <h2 id="method-title" className="text-2xl font-bold text-reed-900">
          {t("methods.title")}
        </h2>
        <ul className="list-disc ps-5 text-sm">
          {report.methodNotes.map((m) => (
            <li key={m.key}>
              <span className="font-semibold">{m.name}</span>: {m.source}
            </li>
          ))}
        </ul>
        <p className="text-sm">{t("methods.engine", { engine: report.engineVersion })}</p>
        {r.rules ? (
          <p className="text-sm">
            {t("headline.seed", { replicates: r.rules.comparison.replicates, seed: r.rules.comparison.seed })}
          </p>
        ) : null}
        <p className="break-all font-mono text-xs">
          {t("methods.hash", { hash: report.inputHash, records: report.inputCount })}
        </p>
        {preview ? null : wantCheck ? (
          <p data-testid="recompute" className="font-semibold">
            {check?.same && check.hashSame ? `✓ ${t("methods.checkSame")}` : `✗ ${t("methods.checkDiffers")}`}
          </p>
        ) : (
          <p>
            <Link
              href={`/events/${slug}/reports/${report.version}?check=1`}
              className="font-semibold text-reed-800 underline"
            >
              {t("methods.checkLink")}
            </Link>
          </p>
        )}
      </section>

      <section aria-labelledby="credits-title" className="space-y-1">
        <h2 id="credits-title" className="text-2xl font-bold text-reed-900">
          {t("credits.title")}
        </h2>
        <p>
          {t("credits.body", {
            organisation: event.organisationName,
            volunteers: credits.volunteers,
            coordinators: credits.coordinators,
          })}
        </p>
      </section>
    </article>
  );
}
