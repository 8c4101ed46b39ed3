import { getFormatter, getLocale, getTranslations } from "next-intl/server";
import type { Results } from "@/lib/results/compute";
import { ResultsCharts, type ChartLabels } from "./results-charts";
import { StatsTable } from "./stats-table";
import { ZoneComparison } from "./zone-comparison";
import { ZoneSimilarity } from "./zone-similarity";
import { HillCharts, type HillChartLabels, type HillSeries } from "./hill-charts";
import { SUFFICIENCY } from "@/lib/results/settings";
import { ABUNDANCE_REASONS, INCIDENCE_REASONS, reasonsText } from "./reasons";

/** Sightings not in the numbers yet (pending review or returned), as results and reports state them. */
export async function PendingNotice({ pending }: { pending: Results["pending"] }) {
  const t = await getTranslations("Results");
  if (!pending) return null;
  const waiting = pending.pending + pending.returned;
  return (
    <aside
      className={
        waiting ? "rounded-lg border-2 border-signal bg-signal-soft p-3" : "rounded-lg border border-reed-200 p-3"
      }
      aria-label={t("pending.title")}
      data-testid="pending-notice"
    >
      <p className="font-bold">{t("pending.title")}</p>
      <p>
        {waiting
          ? t("pending.body", {
              pending: pending.pending,
              returned: pending.returned,
              pendingComplete: pending.pendingInCompleteSessions,
              returnedComplete: pending.returnedInCompleteSessions,
            })
          : t("pending.none")}
      </p>
    </aside>
  );
}

/** The rules that turn records into numbers, in a sentence each. */
export async function RulesNotes() {
  const t = await getTranslations("Results");
  return (
    <ul className="list-disc space-y-1 pl-5 text-sm" data-testid="rules">
      <li>{t("notes.ranks")}</li>
      <li>{t("notes.units")}</li>
      <li>{t("notes.sessionZone")}</li>
      <li>
        {t("notes.sufficiency", {
          individuals: SUFFICIENCY.minIndividuals,
          sessions: SUFFICIENCY.minCompleteSessions,
          coverage: SUFFICIENCY.minCoverage,
        })}
      </li>
    </ul>
  );
}

/** Curves, whole-event and per-zone numbers, zone comparison and species list: shared by the results page and the public report. */
export async function ResultsBody({ results, showSensitivity }: { results: Results; showSensitivity: boolean }) {
  const [t, tHabitat, tGroup, format, locale] = await Promise.all([
    getTranslations("Results"),
    getTranslations("Habitat"),
    getTranslations("TaxonGroup"),
    getFormatter(),
    getLocale(),
  ]);
  type Habitat = Parameters<typeof tHabitat>[0];
  type Group = Parameters<typeof tGroup>[0];
  const labels: ChartLabels = {
    rarefactionTitle: t("charts.rarefaction"),
    accumulationTitle: t("charts.accumulation"),
    rankTitle: t("charts.rank"),
    zonesTitle: t("charts.zones"),
    individuals: t("charts.individuals"),
    sessions: t("charts.sessions"),
    species: t("charts.species"),
    rank: t("charts.rankAxis"),
    abundance: t("charts.abundance"),
    observedPart: t("charts.observedPart"),
    extrapolatedPart: t("charts.extrapolatedPart"),
    band: t("charts.band"),
    observedPoint: t("charts.observedPoint"),
    noData: t("charts.noData"),
    chartSummary: t("charts.summary"),
    zonesSummary: t("charts.zonesSummary"),
    dataTable: t("charts.dataTable"),
    zone: t("charts.zone"),
    part: t("charts.part"),
    lower: t("charts.lower"),
    upper: t("charts.upper"),
  };
  const hillSeries: HillSeries[] = [
    ...(results.event.hill ? [{ name: t("wholeEvent"), hill: results.event.hill }] : []),
    ...results.zones.flatMap((z) => (z.hill ? [{ name: z.name, hill: z.hill }] : [])),
  ];
  const hillKind = results.event.hill?.kind ?? "abundance";
  const hillLabels: HillChartLabels = {
    curveTitle: [t("hill.curve0"), t("hill.curve1"), t("hill.curve2")],
    completenessTitle: t("hill.completeness"),
    profileTitle: t("hill.profile"),
    size: t(hillKind === "abundance" ? "charts.individuals" : "charts.sessions"),
    hill: t("hill.axis"),
    coverage: t("hill.coverage"),
    order: t("hill.order"),
    estimate: t("hill.estimate"),
    observed: t("hill.observed"),
    lower: t("hill.lower"),
    upper: t("hill.upper"),
    part: t("hill.part"),
    parts: { rarefied: t("hill.rarefied"), observed: t("hill.observedPart"), extrapolated: t("hill.extrapolated") },
    extrapolatedSuffix: t("hill.extrapolatedSuffix"),
    bandSuffix: t("hill.bandSuffix"),
    table: t("hill.table"),
    summary: t("hill.summary"),
    zone: t("similarity.zone"),
    noBands: t("hill.noBands"),
  };
  return (
    <div className="space-y-8">
      <PendingNotice pending={results.pending} />
      <RulesNotes />
      <section aria-labelledby="curves-title" className="space-y-3">
        <h2 id="curves-title" className="text-2xl font-bold text-reed-900">
          {t("charts.title")}
        </h2>
        <ResultsCharts
          rarefaction={results.event.rarefaction}
          accumulation={results.event.accumulation}
          ranks={results.species.map((s) => s.individuals)}
          zones={results.zones
            .filter((z) => z.rarefaction.length > 0)
            .map((z) => ({ name: z.name, rarefaction: z.rarefaction }))}
          labels={labels}
          rarefactionNote={
            results.event.individuals > 0 && !results.event.abundance
              ? t("tooFew.abundanceWithheld", {
                  reasons: reasonsText(
                    t,
                    results.event.reasons.filter((r) => ABUNDANCE_REASONS.includes(r)),
                    results.event,
                  ),
                })
              : undefined
          }
          accumulationNote={
            results.event.individuals > 0 && !results.event.incidence
              ? t("tooFew.incidenceWithheld", {
                  reasons: reasonsText(
                    t,
                    results.event.reasons.filter((r) => INCIDENCE_REASONS.includes(r)),
                    results.event,
                  ),
                })
              : undefined
          }
        />
      </section>

      <section aria-labelledby="hill-title" className="space-y-3">
        <h2 id="hill-title" className="text-2xl font-bold text-reed-900">
          {t("hill.title")}
        </h2>
        {hillSeries.length === 0 ? (
          <p>{t("hill.none")}</p>
        ) : (
          <>
            <p className="max-w-prose text-sm">
              {t(hillKind === "abundance" ? "hill.introAbundance" : "hill.introIncidence", {
                replicates: results.rules.hill?.replicates ?? 0,
                seed: results.rules.hill?.seed ?? 0,
              })}
            </p>
            <HillCharts series={hillSeries} labels={hillLabels} xLabel={hillLabels.size} />
          </>
        )}
      </section>

      <ZoneComparison comparison={results.comparison} countUnits={results.event.countUnits} />

      <ZoneSimilarity similarity={results.similarity ?? null} />

      <section aria-labelledby="numbers-title" className="space-y-4">
        <h2 id="numbers-title" className="text-2xl font-bold text-reed-900">
          {t("numbersTitle")}
        </h2>
        <StatsTable block={results.event} caption={t("wholeEvent")} sessions={results.event.completeSessions} />
        {results.zones.map((z) => (
          <details key={z.id} className="rounded-lg border border-reed-200 bg-white/70 p-3">
            <summary className="cursor-pointer font-semibold">
              {z.name} ({tHabitat(z.habitat as Habitat)})
            </summary>
            <StatsTable block={z} caption={t("zoneCaption", { zone: z.name })} sessions={z.completeSessions} />
          </details>
        ))}
      </section>

      <section aria-labelledby="species-list-title" className="space-y-3">
        <h2 id="species-list-title" className="text-2xl font-bold text-reed-900">
          {t("speciesTitle", { count: results.species.length })}
        </h2>
        <table className="w-full text-start text-sm">
          <caption className="sr-only">{t("speciesTitle", { count: results.species.length })}</caption>
          <thead>
            <tr className="border-b-2 border-reed-300">
              <th scope="col" className="py-1 pe-3">
                {t("col.species")}
              </th>
              <th scope="col" className="py-1 pe-3">
                {t("col.group")}
              </th>
              <th scope="col" className="py-1 pr-3">
                {t("col.unit")}
              </th>
              <th scope="col" className="py-1 text-right">
                {t("col.individuals")}
              </th>
            </tr>
          </thead>
          <tbody>
            {results.species.map((s) => (
              <tr key={s.id} className="border-b border-reed-100">
                <th scope="row" className="py-1 pe-3 font-normal">
                  <span className="font-semibold">{s.names[locale] ?? s.names.en ?? s.scientificName}</span>{" "}
                  <i className="text-ink-soft">{s.scientificName}</i>
                  {s.rankStatus === "folded" || s.rankStatus === "aboveSpecies" || s.rankStatus === "leftOut" ? (
                    <span className="ml-2 text-xs text-ink-soft" data-rank-status={s.rankStatus}>
                      ({t(`rankStatus.${s.rankStatus}`)})
                    </span>
                  ) : null}
                  {showSensitivity && s.sensitivity !== "open" ? (
                    <span className="ms-2 rounded border border-heath-600 px-1 text-xs text-heath-900">
                      ⚠ {t(`sensitivity.${s.sensitivity}`)}
                    </span>
                  ) : null}
                </th>
                <td className="py-1 pr-3">{tGroup(s.group as Group)}</td>
                <td className="py-1 pr-3">{t(`unit.${s.countUnit ?? "individuals"}`)}</td>
                <td className="py-1 text-right tabular-nums">{format.number(s.individuals)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </section>
    </div>
  );
}
