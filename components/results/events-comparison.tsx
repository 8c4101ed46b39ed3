import { getFormatter, getTranslations } from "next-intl/server";
import type { EarlierEvent } from "@/db/queries/results";
import type { EventComparison } from "@/lib/results/compare-events";
import { reasonsText } from "./reasons";
import { EffortHeaders, EffortStandard } from "./zone-comparison";

/**
 * This event beside an earlier event of the same site: richness at equal coverage (the
 * standard, named with its value) and equal sample size, Hill numbers at that coverage, and
 * one sentence with the zones' rule ("more"/"fewer" only when the bootstrap interval of the
 * difference excludes 0). A plain GET form chooses the earlier event (works without script);
 * a report shows the comparison it froze at publishing, without the form (no candidates).
 */
export async function EventsComparison({
  candidates,
  chosen,
  comparison,
}: {
  candidates: EarlierEvent[];
  chosen: EarlierEvent | null;
  comparison: EventComparison | null;
}) {
  const [t, format] = await Promise.all([getTranslations("Results"), getFormatter()]);
  const n = (v: number) => (Number.isFinite(v) ? format.number(v, { maximumFractionDigits: 1 }) : t("undefinedValue"));
  const pct = (v: number) => format.number(v, { style: "percent", maximumFractionDigits: 1 });
  const year = (iso: string) => format.dateTime(new Date(iso), { year: "numeric", month: "long" });
  const c = comparison;
  const [now, then] = c?.events ?? [];
  return (
    <section aria-labelledby="events-comparison-title" className="space-y-3">
      <h2 id="events-comparison-title" className="text-2xl font-bold text-reed-900">
        {t("betweenEvents.title")}
      </h2>
      {candidates.length === 0 && !chosen ? (
        <p className="max-w-prose">{t("betweenEvents.none")}</p>
      ) : candidates.length === 0 ? null : (
        <form method="get" className="flex flex-wrap items-end gap-2">
          <label className="flex flex-col text-sm font-semibold">
            {t("betweenEvents.choose")}
            <select
              name="compare"
              defaultValue={chosen?.id}
              className="mt-1 rounded border border-reed-300 bg-white px-2 py-1 font-normal"
            >
              {candidates.map((e) => (
                <option key={e.id} value={e.id}>
                  {e.name} ({year(e.startsAt)})
                </option>
              ))}
            </select>
          </label>
          <button type="submit" className="rounded bg-reed-800 px-3 py-1 font-semibold text-white">
            {t("betweenEvents.submit")}
          </button>
        </form>
      )}
      {c && now && then ? (
        <>
          {c.coverage > 0 ? <EffortStandard kind={c.kind} size={c.size} coverage={c.coverage} /> : null}
          <table className="w-full text-start text-sm">
            <caption className="sr-only">{t("betweenEvents.title")}</caption>
            <thead>
              <tr className="border-b-2 border-reed-300">
                <th scope="col" className="py-1 pe-3">
                  {t("betweenEvents.event")}
                </th>
                <th scope="col" className="py-1 pe-3 text-end">
                  {t("betweenEvents.observed")}
                </th>
                <EffortHeaders kind={c.kind} size={c.size} coverage={c.coverage} />
                <th scope="col" className="py-1 pe-3 text-end">
                  {t("betweenEvents.hill1")}
                </th>
                <th scope="col" className="py-1 text-end">
                  {t("betweenEvents.hill2")}
                </th>
              </tr>
            </thead>
            <tbody>
              {c.events.map((e) => {
                const hill = (q: number) => e.hill.find((h) => h.order === q);
                return (
                  <tr key={e.id} className="border-b border-reed-100">
                    <th scope="row" className="py-1 pe-3 font-semibold">
                      {e.name} <span className="font-normal text-ink-soft">({year(e.startsAt)})</span>
                    </th>
                    <td className="py-1 pe-3 text-end tabular-nums">{e.observed}</td>
                    <td className="py-1 pe-3 text-end tabular-nums">
                      {e.atCoverage
                        ? `${n(e.atCoverage.richness)} (${n(e.atCoverage.lower)} – ${n(e.atCoverage.upper)})`
                        : t("betweenEvents.tooFew")}
                    </td>
                    <td className="py-1 pe-3 text-end tabular-nums">
                      {e.atSize
                        ? `${n(e.atSize.richness)} (${n(e.atSize.lower)} – ${n(e.atSize.upper)})`
                        : t("betweenEvents.tooFew")}
                    </td>
                    <td className="py-1 pe-3 text-end tabular-nums">{hill(1) ? n(hill(1)!.estimate) : "—"}</td>
                    <td className="py-1 text-end tabular-nums">{hill(2) ? n(hill(2)!.estimate) : "—"}</td>
                  </tr>
                );
              })}
            </tbody>
          </table>
          {c.sentence ? (
            <p className="max-w-prose" data-testid="events-comparison-sentence">
              {t(`betweenEvents.sentence.${c.sentence.verdict}`, {
                a: now.name,
                b: then.name,
                coverage: pct(c.coverage),
                difference: n(Math.abs(c.sentence.difference)),
                lower: n(c.sentence.lower),
                upper: n(c.sentence.upper),
                replicates: c.replicates,
              })}
            </p>
          ) : null}
          {c.leftOut.length ? (
            <ul className="list-disc ps-5" data-testid="events-comparison-left-out">
              {c.leftOut.map((e) => (
                <li key={e.id}>
                  {t("betweenEvents.leftOutLine", {
                    event: e.name,
                    reasons: reasonsText(t, e.reasons, { countUnits: [] }),
                  })}
                </li>
              ))}
            </ul>
          ) : null}
          <p className="max-w-prose text-sm text-ink-soft">{t("betweenEvents.note")}</p>
        </>
      ) : null}
    </section>
  );
}
