import { notFound } from "next/navigation";
import { getTranslations, setRequestLocale } from "next-intl/server";
import { getPublicEventBySlug } from "@/db/queries/events";
import { requirePageEventRole } from "@/server/auth/page";
import type { Locale } from "@/lib/i18n/routing";
import { EstimateCaution } from "@/components/results/zone-comparison";
import { LiveBoard, type LiveLabels } from "./_components/live-board";
import { SUFFICIENCY } from "@/lib/results/settings";
import { messageTemplate } from "@/lib/i18n/template";

export const dynamic = "force-dynamic";

type Props = { params: Promise<{ locale: Locale; slug: string }> };

type Plain = Exclude<keyof LiveLabels, `reason.${string}` | `verdict.${string}` | `kind.${string}` | "pendingBody">;
const KEYS: Plain[] = [
  "perHour",
  "volunteers",
  "lastHour",
  "today",
  "total",
  "backlog",
  "completeness",
  "share",
  "coverage",
  "nextTitle",
  "nextIntro",
  "nextAccess",
  "zoneLine",
  "unsampled",
  "loading",
  "failed",
  "updated",
  "hour",
  "sightings",
  "completenessNote",
  "coverageSample",
  "coverageIncidence",
  "tooFew",
  "eventTooFew",
  "besideTitle",
  "besideNone",
  "besideStandard",
  "besideRow",
  "besideTooFew",
  "besideAsOf",
];

export default async function LivePage({ params }: Props) {
  const { locale, slug } = await params;
  setRequestLocale(locale);
  const event = await getPublicEventBySlug(slug);
  if (!event) notFound();
  const permit = await requirePageEventRole(locale, event.id, "coordinator", `/events/${slug}/live`);
  const t = await getTranslations("Results");
  if (!permit) return <p role="alert">{t("notAllowed")}</p>;
  // Placeholders stay as {name} for the client to fill.
  const raw = (k: Plain) => messageTemplate(t.raw(`live.${k}`));
  const reasons = {
    "reason.countUnits": t("tooFew.reasons.countUnits", {
      units: [t("unit.stems"), t("unit.clumps"), t("unit.colonies"), t("unit.presence")].join(", "),
    }),
    "reason.individuals": t("tooFew.reasons.individuals", { min: SUFFICIENCY.minIndividuals }),
    "reason.coverage": t("tooFew.reasons.coverage", { min: SUFFICIENCY.minCoverage }),
    "reason.sessions": t("tooFew.reasons.sessions", { min: SUFFICIENCY.minCompleteSessions }),
    "reason.incidenceCoverage": t("tooFew.reasons.incidenceCoverage", { min: SUFFICIENCY.minCoverage }),
  };
  // The results page's own sentences: the verdict rule, the kind of data compared, pending records.
  const shared = {
    "verdict.more": messageTemplate(t.raw("betweenEvents.sentence.more")),
    "verdict.fewer": messageTemplate(t.raw("betweenEvents.sentence.fewer")),
    "verdict.noClearDifference": messageTemplate(t.raw("betweenEvents.sentence.noClearDifference")),
    "kind.abundance": t("comparison.kindAbundance"),
    "kind.incidence": t("comparison.kindIncidence"),
    pendingBody: messageTemplate(t.raw("pending.body")),
  };
  const labels = { ...Object.fromEntries(KEYS.map((k) => [k, raw(k)])), ...reasons, ...shared } as LiveLabels;
  return (
    <article className="space-y-6">
      <h1 className="text-3xl font-bold text-reed-900">{t("live.title", { event: event.name })}</h1>
      <EstimateCaution />
      <LiveBoard eventId={event.id} labels={labels} locale={locale} timeZone={event.timeZone} />
    </article>
  );
}
