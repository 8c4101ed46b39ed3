import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { getTranslations, setRequestLocale } from "next-intl/server";
import { queueChoices, reviewEventBySlug } from "@/db/queries/review";
import { requirePageEventRole } from "@/server/auth/page";
import { Link } from "@/lib/i18n/navigation";
import type { Locale } from "@/lib/i18n/routing";
import { CHECK_MARKS, REJECT_REASONS, REVIEW_STATES, TAXON_GROUPS } from "@/lib/domain";
import { ReviewDesk } from "./_components/review-desk";
import { MapSettingsProvider } from "@/components/map/map-settings";
import { mapSettings } from "@/server/map-settings";

export const dynamic = "force-dynamic";

type Props = { params: Promise<{ locale: Locale; slug: string }> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  const { locale } = await params;
  const t = await getTranslations({ locale, namespace: "ReviewDesk" });
  return { title: t("title") };
}

// The review desk (coordinators, organisers): the queue, the detail pane and decisions.
export default async function ReviewDeskPage({ params }: Props) {
  const { locale, slug } = await params;
  setRequestLocale(locale);
  const event = await reviewEventBySlug(slug);
  if (!event) notFound();
  const permit = await requirePageEventRole(locale, event.id, "coordinator", `/events/${slug}/review`);
  const [t, tGroup] = await Promise.all([getTranslations("ReviewDesk"), getTranslations("TaxonGroup")]);
  if (!permit) {
    return (
      <p role="alert" className="rounded-lg border-2 border-signal bg-signal-soft p-4 font-semibold text-signal">
        {t("notAllowed")}
      </p>
    );
  }
  const scope = { eventId: event.id, taxonGroups: permit.taxonGroups, locale };
  const choices = await queueChoices(scope);
  const groups = permit.taxonGroups.length
    ? TAXON_GROUPS.filter((g) => permit.taxonGroups.includes(g))
    : [...TAXON_GROUPS];
  return (
    <div className="space-y-4">
      <header>
        <h1 className="text-3xl font-bold text-reed-900">{t("title")}</h1>
        <p className="text-lg">{event.name}</p>
        <p className="text-sm text-ink-soft">
          {permit.taxonGroups.length
            ? t("scopeGroups", { groups: groups.map((g) => tGroup(g)).join(", ") })
            : t("scopeAll")}{" "}
          {t("timeNote", { zone: event.timeZone })}
        </p>
        <p className="text-sm">
          <Link href={`/events/${slug}/review/paper`} className="underline">
            {t("paperSheets")}
          </Link>
        </p>
      </header>
      <MapSettingsProvider settings={mapSettings()}>
        <ReviewDesk
          eventId={event.id}
          timeZone={event.timeZone}
          zones={choices.zones}
          volunteers={choices.volunteers}
          groups={groups}
          marks={[...CHECK_MARKS]}
          states={[...REVIEW_STATES]}
          reasons={[...REJECT_REASONS]}
        />
      </MapSettingsProvider>
    </div>
  );
}
