import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { getFormatter, getTranslations, setRequestLocale } from "next-intl/server";
import { getMemberEventBySlug } from "@/db/queries/events";
import { listReports } from "@/db/queries/reports";
import { ResultsBody } from "@/components/results/results-body";
import { EstimateCaution } from "@/components/results/zone-comparison";
import { requirePageEventRole } from "@/server/auth/page";
import { LocaleLink as Link } from "@/components/locale-link";
import type { Locale } from "@/lib/i18n/routing";
import { currentResults } from "@/server/results/current";
import { comparisonWithEarlier } from "@/server/results/compare-events";
import { EventsComparison } from "@/components/results/events-comparison";
import { WithdrawForm } from "./_components/withdraw-form";
import { CountUnitsForm } from "./_components/count-units-form";
import { eventCountUnits } from "@/db/queries/results";
import { COUNT_UNITS, DEFAULT_COUNT_UNITS, countUnitOf } from "@/lib/results/settings";

export const dynamic = "force-dynamic";

type Props = {
  params: Promise<{ locale: Locale; slug: string }>;
  searchParams: Promise<{ compare?: string | string[] }>;
};

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  const { slug } = await params;
  const t = await getTranslations("Results");
  const event = await getMemberEventBySlug(slug);
  return event ? { title: t("title", { event: event.name }) } : {};
}

export default async function ResultsPage({ params, searchParams }: Props) {
  const { locale, slug } = await params;
  const { compare } = await searchParams;
  setRequestLocale(locale);
  const event = await getMemberEventBySlug(slug);
  if (!event) notFound();
  const permit = await requirePageEventRole(locale, event.id, "coordinator", `/events/${slug}/results`);
  const t = await getTranslations("Results");
  if (!permit) return <p role="alert">{t("notAllowed")}</p>;
  const [format, { results }, reports, chosenUnits, tGroup] = await Promise.all([
    getFormatter(),
    currentResults(event.id),
    listReports(event.id),
    eventCountUnits(event.id),
    getTranslations("TaxonGroup"),
  ]);
  const canPublish = permit.role === "organiser" || permit.role === "admin";
  // Earlier events of the site are the organisation's: their organisers see them beside this one.
  const beside = canPublish
    ? await comparisonWithEarlier(event, typeof compare === "string" ? compare : undefined)
    : null;
  const groups = Object.keys(DEFAULT_COUNT_UNITS);
  const unitRows = groups.map((group) => ({
    group,
    unit: countUnitOf(group, chosenUnits),
    chosen: group in chosenUnits,
  }));
  return (
    <article className="space-y-8">
      <header className="space-y-2">
        <h1 className="text-3xl font-bold text-reed-900">{t("title", { event: event.name })}</h1>
        <p className="max-w-prose text-ink-soft">
          {t("intro", {
            species: results.totals.species,
            individuals: results.totals.individuals,
            sessions: results.totals.completeSessions,
          })}
        </p>
        <p>
          <Link href={`/events/${slug}/live`} className="font-semibold text-reed-800 underline">
            {t("live.link")}
          </Link>
        </p>
      </header>
      <EstimateCaution />
      <ResultsBody results={results} showSensitivity />
      {beside ? <EventsComparison {...beside} /> : null}

      {canPublish ? (
        <CountUnitsForm
          eventId={event.id}
          rows={unitRows}
          groups={Object.fromEntries(groups.map((g) => [g, tGroup(g as Parameters<typeof tGroup>[0])]))}
          units={Object.fromEntries(COUNT_UNITS.map((u) => [u, t(`unit.${u}`)]))}
          labels={{
            title: t("countUnits.title"),
            intro: t("countUnits.intro"),
            group: t("countUnits.group"),
            unit: t("countUnits.unit"),
            saved: t("countUnits.saved"),
            failed: t("countUnits.failed"),
            default: t("countUnits.default"),
          }}
        />
      ) : null}

      <section aria-labelledby="reports-title" className="space-y-3">
        <h2 id="reports-title" className="text-2xl font-bold text-reed-900">
          {t("reports.title")}
        </h2>
        <p className="max-w-prose">{t("reports.intro")}</p>
        {canPublish ? (
          // Every version is published from its preview: the report exactly as the public will read
          // it, with what is left out named, a confirmation, a note and the choice to mail participants.
          <p>
            <Link
              href={`/events/${slug}/reports/preview`}
              className="inline-block rounded bg-reed-800 px-4 py-2 font-semibold text-white"
            >
              {t("reports.preview")}
            </Link>
          </p>
        ) : null}
        {reports.length === 0 ? (
          <p>{t("reports.none")}</p>
        ) : (
          <ul className="space-y-2">
            {reports.map((r) => (
              <li key={r.id} className="rounded-lg border border-reed-200 bg-white/70 p-3">
                <Link href={`/events/${slug}/reports/${r.version}`} className="font-semibold text-reed-800 underline">
                  {t("reports.version", { version: r.version })}
                </Link>
                {" · "}
                {format.dateTime(r.publishedAt, { dateStyle: "medium", timeStyle: "short", timeZone: event.timeZone })}
                {r.superseded ? <span className="ms-2 text-ink-soft">({t("reports.superseded")})</span> : null}
                {r.withdrawnAt ? (
                  <span className="ms-2 font-semibold text-signal">
                    ({t("reports.withdrawnMark", { reason: r.withdrawReason ?? "" })})
                  </span>
                ) : null}
                <span className="block font-mono text-xs text-ink-soft">sha256 {r.inputHash}</span>
                {canPublish && !r.withdrawnAt ? (
                  <WithdrawForm
                    eventId={event.id}
                    version={r.version}
                    open={t("reports.withdraw", { version: r.version })}
                    reason={t("reports.withdrawReason")}
                    hint={t("reports.withdrawHint")}
                    confirm={t("reports.withdrawConfirm")}
                    done={t("reports.withdrawDone", { version: r.version })}
                  />
                ) : null}
              </li>
            ))}
          </ul>
        )}
      </section>
    </article>
  );
}
