import { getFormatter, getTranslations } from "next-intl/server";
import type { Similarity } from "@/lib/results/compute";

/**
 * Between zones: a zone × zone table of shared species and Sørensen- and Jaccard-type
 * similarity with the correction for unseen shared species (Chao et al. 2005), the classic
 * index beside it, and the multiplicative beta diversity (Jost 2007), with how to read each.
 */
export async function ZoneSimilarity({ similarity }: { similarity: Similarity | null }) {
  const [t, format] = await Promise.all([getTranslations("Results"), getFormatter()]);
  const n = (v: number) => (Number.isFinite(v) ? format.number(v, { maximumFractionDigits: 2 }) : t("undefinedValue"));
  const s = similarity;
  // Reports published before the intervals existed have none: show the values alone.
  const range = (iv: [number, number] | null | undefined) => (iv ? ` [${n(iv[0])}–${n(iv[1])}]` : "");
  const matrix = (title: string, note: string, cell: (c: Similarity["cells"][number][number]) => string) =>
    s ? (
      <div className="space-y-1">
        <table className="w-full text-left text-sm tabular-nums">
          <caption className="text-left font-semibold">{title}</caption>
          <thead>
            <tr className="border-b-2 border-reed-300">
              <th scope="col" className="py-1 pr-3">
                {t("similarity.zone")}
              </th>
              {s.zones.map((z) => (
                <th key={z.id} scope="col" className="py-1 pr-3 text-right">
                  {z.name}
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {s.zones.map((z, i) => (
              <tr key={z.id} className="border-b border-reed-100">
                <th scope="row" className="py-1 pr-3 font-normal">
                  {z.name}
                </th>
                {s.zones.map((w, j) => (
                  <td key={w.id} className="py-1 pr-3 text-right">
                    {cell(s.cells[i]![j]!)}
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
        <p className="max-w-prose text-sm text-ink-soft">{note}</p>
      </div>
    ) : null;
  return (
    <section aria-labelledby="similarity-title" className="space-y-4" data-testid="zone-similarity">
      <h2 id="similarity-title" className="text-2xl font-bold text-reed-900">
        {t("similarity.title")}
      </h2>
      {!s ? (
        <p>{t("similarity.none")}</p>
      ) : (
        <>
          <p className="max-w-prose">
            {t(s.kind === "abundance" ? "similarity.kindAbundance" : "similarity.kindIncidence")}
          </p>
          {matrix(t("similarity.sharedTitle"), t("similarity.sharedNote"), (c) => String(c.shared))}
          {matrix(
            t("similarity.sorensenTitle"),
            t("similarity.sorensenNote"),
            (c) => `${n(c.sorensenAdjusted)}${range(c.sorensenInterval)} (${n(c.sorensen)})`,
          )}
          {matrix(
            t("similarity.jaccardTitle"),
            t("similarity.jaccardNote"),
            (c) => `${n(c.jaccardAdjusted)}${range(c.jaccardInterval)} (${n(c.jaccard)})`,
          )}
          <p className="max-w-prose text-sm text-ink-soft">
            {/* replicates 0: the first read after a change, the intervals come from a worker thread. */}
            {s.replicates === 0
              ? t("similarity.intervalsComing")
              : t(s.kind === "abundance" ? "similarity.intervalAbundance" : "similarity.intervalIncidence", {
                  replicates: s.replicates ?? 0,
                  seed: s.seed ?? 0,
                })}
          </p>
          <table className="w-full text-left text-sm tabular-nums">
            <caption className="text-left font-semibold">{t("similarity.betaTitle")}</caption>
            <thead>
              <tr className="border-b-2 border-reed-300">
                <th scope="col" className="py-1 pr-3">
                  {t("similarity.order")}
                </th>
                <th scope="col" className="py-1 pr-3 text-right">
                  {t("similarity.gamma")}
                </th>
                <th scope="col" className="py-1 pr-3 text-right">
                  {t("similarity.alpha")}
                </th>
                <th scope="col" className="py-1 text-right">
                  {t("similarity.beta")}
                </th>
              </tr>
            </thead>
            <tbody>
              {s.beta.map((b) => (
                <tr key={b.order} className="border-b border-reed-100">
                  <th scope="row" className="py-1 pr-3 font-normal">
                    q = {b.order}
                  </th>
                  <td className="py-1 pr-3 text-right">{n(b.gamma)}</td>
                  <td className="py-1 pr-3 text-right">{n(b.alpha)}</td>
                  <td className="py-1 text-right">{n(b.beta)}</td>
                </tr>
              ))}
            </tbody>
          </table>
          <p className="max-w-prose text-sm text-ink-soft">{t("similarity.betaNote", { zones: s.zones.length })}</p>
        </>
      )}
    </section>
  );
}
