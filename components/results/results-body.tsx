import { getFormatter, getLocale, getTranslations } from "next-intl/server";
import type { Results } from "@/lib/results/compute";
import { ResultsCharts, type ChartLabels } from "./results-charts";
import { StatsTable } from "./stats-table";
import { ZoneComparison } from "./zone-comparison";

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
  return (
    <div className="space-y-8">
      <section aria-labelledby="curves-title" className="space-y-3">
        <h2 id="curves-title" className="text-2xl font-bold text-reed-900">
          {t("charts.title")}
        </h2>
        <ResultsCharts
          rarefaction={results.event.rarefaction}
          accumulation={results.event.accumulation}
          ranks={results.species.map((s) => s.individuals)}
          zones={results.zones
            .filter((z) => z.abundance.individuals > 0)
            .map((z) => ({ name: z.name, rarefaction: z.rarefaction }))}
          labels={labels}
        />
      </section>

      <ZoneComparison comparison={results.comparison} />

      <section aria-labelledby="numbers-title" className="space-y-4">
        <h2 id="numbers-title" className="text-2xl font-bold text-reed-900">
          {t("numbersTitle")}
        </h2>
        <StatsTable block={results.event} caption={t("wholeEvent")} sessions={results.event.incidence?.units ?? 0} />
        {results.zones.map((z) => (
          <details key={z.id} className="rounded-lg border border-reed-200 bg-white/70 p-3">
            <summary className="cursor-pointer font-semibold">
              {z.name} ({tHabitat(z.habitat as Habitat)})
            </summary>
            <StatsTable block={z} caption={t("zoneCaption", { zone: z.name })} sessions={z.incidence?.units ?? 0} />
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
              <th scope="col" className="py-1 text-end">
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
                  {showSensitivity && s.sensitivity !== "open" ? (
                    <span className="ms-2 rounded border border-heath-600 px-1 text-xs text-heath-900">
                      ⚠ {t(`sensitivity.${s.sensitivity}`)}
                    </span>
                  ) : null}
                </th>
                <td className="py-1 pe-3">{tGroup(s.group as Group)}</td>
                <td className="py-1 text-end tabular-nums">{format.number(s.individuals)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </section>
    </div>
  );
}
