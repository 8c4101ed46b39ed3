import { getFormatter, getLocale, getTranslations } from "next-intl/server";
import type { Comparison } from "@/lib/results/compute";
import { reasonsText } from "./reasons";

/**
 * Zones at equal coverage (the standard, named with its value) and equal sample size, the
 * sentences ("more"/"fewer" only when the bootstrap interval of the difference excludes 0),
 * the zones left out for too few records, and the caution beside them.
 */
export async function ZoneComparison({
  comparison,
  countUnits = [],
}: {
  comparison: Comparison | null;
  countUnits?: Parameters<typeof reasonsText>[2]["countUnits"];
}) {
  const [t, tHabitat, format, locale] = await Promise.all([
    getTranslations("Results"),
    getTranslations("Habitat"),
    getFormatter(),
    getLocale(),
  ]);
  type Habitat = Parameters<typeof tHabitat>[0];
  const n = (v: number) => (Number.isFinite(v) ? format.number(v, { maximumFractionDigits: 1 }) : t("undefinedValue"));
  const pct = (v: number) => format.number(v, { style: "percent", maximumFractionDigits: 1 });
  const c = comparison;
  return (
    <section aria-labelledby="comparison-title" className="space-y-3">
      <h2 id="comparison-title" className="text-2xl font-bold text-reed-900">
        {t("comparison.title")}
      </h2>
      {!c || c.zones.length < 2 ? (
        <p>{t("comparison.none")}</p>
      ) : (
        <>
          <EffortStandard kind={c.kind} size={c.size} coverage={c.coverage} />
          <table className="w-full text-start text-sm">
            <caption className="sr-only">{t("comparison.title")}</caption>
            <thead>
              <tr className="border-b-2 border-reed-300">
                <th scope="col" className="py-1 pe-3">
                  {t("comparison.zone")}
                </th>
                <EffortHeaders kind={c.kind} size={c.size} coverage={c.coverage} />
              </tr>
            </thead>
            <tbody>
              {c.zones.map((z) => (
                <tr key={z.id} className="border-b border-reed-100">
                  <th scope="row" className="py-1 pe-3 font-semibold">
                    {z.name} <span className="font-normal text-ink-soft">({tHabitat(z.habitat as Habitat)})</span>
                  </th>
                  <td className="py-1 pr-3 text-right tabular-nums">
                    {n(z.atCoverage.richness)} ({n(z.atCoverage.lower)} – {n(z.atCoverage.upper)})
                  </td>
                  <td className="py-1 text-right tabular-nums">
                    {n(z.atSize.richness)} ({n(z.atSize.lower)} – {n(z.atSize.upper)})
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
          <ul className="list-disc space-y-1 pl-5" data-testid="comparison-sentences">
            {c.sentences.map((s) => {
              const a = c.zones.find((z) => z.id === s.a)!;
              const b = c.zones.find((z) => z.id === s.b)!;
              // Mid-sentence, the habitat word is written in lower case ("Alder Fringe (edge)").
              const lower = (h: string) => tHabitat(h as Habitat).toLocaleLowerCase(locale);
              const values = {
                a: a.name,
                aHabitat: lower(a.habitat),
                b: b.name,
                bHabitat: lower(b.habitat),
                coverage: pct(c.coverage),
                difference: n(Math.abs(s.difference)),
                lower: n(s.lower),
                upper: n(s.upper),
                replicates: c.replicates,
              };
              return <li key={`${s.a}-${s.b}`}>{t(`comparison.sentence.${s.verdict}`, values)}</li>;
            })}
          </ul>
        </>
      )}
      {c && c.leftOut.length ? (
        <div data-testid="comparison-left-out">
          <p className="font-semibold">{t("comparison.leftOutTitle")}</p>
          <ul className="list-disc pl-5">
            {c.leftOut.map((z) => (
              <li key={z.id}>
                {t("comparison.leftOutLine", { zone: z.name, reasons: reasonsText(t, z.reasons, { countUnits }) })}
              </li>
            ))}
          </ul>
        </div>
      ) : null}
      <EstimateCaution />
    </section>
  );
}

type Effort = Pick<Comparison, "kind" | "size" | "coverage">;

/** The standard of a comparison in words: equal coverage (named with its value) and equal size, on which data. */
export async function EffortStandard({ kind, size, coverage }: Effort) {
  const [t, format] = await Promise.all([getTranslations("Results"), getFormatter()]);
  return (
    <p className="max-w-prose">
      {t(kind === "abundance" ? "comparison.kindAbundance" : "comparison.kindIncidence")}{" "}
      {t("comparison.intro", {
        size,
        coverage: format.number(coverage, { style: "percent", maximumFractionDigits: 1 }),
        unit: t(kind === "abundance" ? "comparison.unitIndividuals" : "comparison.unitSessions"),
      })}
    </p>
  );
}

/** The two column headers of richness at equal coverage and at equal size. */
export async function EffortHeaders({ kind, size, coverage }: Effort) {
  const [t, format] = await Promise.all([getTranslations("Results"), getFormatter()]);
  return (
    <>
      <th scope="col" className="py-1 pe-3 text-end">
        {t("comparison.atCoverage", {
          coverage: format.number(coverage, { style: "percent", maximumFractionDigits: 1 }),
        })}
      </th>
      <th scope="col" className="py-1 pe-3 text-end">
        {kind === "abundance" ? t("comparison.atSize", { size }) : t("comparison.atSizeSessions", { size })}
      </th>
    </>
  );
}

/** design.md, "Cautions the product shows": reading estimates. */
export async function EstimateCaution() {
  const t = await getTranslations("Results");
  return (
    <aside className="rounded-lg border-2 border-heath-500 bg-heath-50 p-3" aria-label={t("caution.title")}>
      <p className="font-bold text-heath-900">{t("caution.title")}</p>
      <p>{t("caution.body")}</p>
    </aside>
  );
}
