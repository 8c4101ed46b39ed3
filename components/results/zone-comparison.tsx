import { getFormatter, getLocale, getTranslations } from "next-intl/server";
import type { Comparison } from "@/lib/results/compute";

/** Zones at equal effort (sample size and coverage), with plain-language sentences and the caution beside them. */
export async function ZoneComparison({ comparison }: { comparison: Comparison | null }) {
  const [t, tHabitat, format, locale] = await Promise.all([
    getTranslations("Results"),
    getTranslations("Habitat"),
    getFormatter(),
    getLocale(),
  ]);
  type Habitat = Parameters<typeof tHabitat>[0];
  const n = (v: number) => (Number.isFinite(v) ? format.number(v, { maximumFractionDigits: 1 }) : t("undefinedValue"));
  return (
    <section aria-labelledby="comparison-title" className="space-y-3">
      <h2 id="comparison-title" className="text-2xl font-bold text-reed-900">
        {t("comparison.title")}
      </h2>
      {!comparison ? (
        <p>{t("comparison.none")}</p>
      ) : (
        <>
          <p className="max-w-prose">
            {t("comparison.intro", {
              size: comparison.size,
              coverage: format.number(comparison.coverage, { style: "percent", maximumFractionDigits: 1 }),
            })}
          </p>
          <table className="w-full text-start text-sm">
            <caption className="sr-only">{t("comparison.title")}</caption>
            <thead>
              <tr className="border-b-2 border-reed-300">
                <th scope="col" className="py-1 pe-3">
                  {t("comparison.zone")}
                </th>
                <th scope="col" className="py-1 pe-3 text-end">
                  {t("comparison.atSize", { size: comparison.size })}
                </th>
                <th scope="col" className="py-1 text-end">
                  {t("comparison.atCoverage", {
                    coverage: format.number(comparison.coverage, { style: "percent", maximumFractionDigits: 1 }),
                  })}
                </th>
              </tr>
            </thead>
            <tbody>
              {comparison.zones.map((z) => (
                <tr key={z.id} className="border-b border-reed-100">
                  <th scope="row" className="py-1 pe-3 font-semibold">
                    {z.name} <span className="font-normal text-ink-soft">({tHabitat(z.habitat as Habitat)})</span>
                  </th>
                  <td className="py-1 pe-3 text-end tabular-nums">
                    {n(z.atSize.richness)} ({n(z.atSize.lower)} – {n(z.atSize.upper)})
                  </td>
                  <td className="py-1 text-end tabular-nums">
                    {n(z.atCoverage.richness)} ({n(z.atCoverage.lower)} – {n(z.atCoverage.upper)})
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
          <ul className="list-disc space-y-1 ps-5" data-testid="comparison-sentences">
            {comparison.sentences.map((s) => {
              const a = comparison.zones.find((z) => z.id === s.a)!;
              const b = comparison.zones.find((z) => z.id === s.b)!;
              // Mid-sentence, the habitat word is written in lower case ("Alder Fringe (edge)").
              const lower = (h: string) => tHabitat(h as Habitat).toLocaleLowerCase(locale);
              const values = { a: a.name, aHabitat: lower(a.habitat), b: b.name, bHabitat: lower(b.habitat) };
              return (
                <li key={`${s.a}-${s.b}`}>
                  {t(`comparison.sentence.${s.verdict}`, values)}{" "}
                  {t(s.overlap ? "comparison.overlap" : "comparison.noOverlap")}
                </li>
              );
            })}
          </ul>
        </>
      )}
      <EstimateCaution />
    </section>
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
