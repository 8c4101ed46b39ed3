import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { getFormatter, getTranslations, setRequestLocale } from "next-intl/server";
import { getPublicEventBySlug, listZones, speciesListSummary } from "@/db/queries/events";
import { EventStatusBadge } from "@/components/event-status-badge";
import { SafetyNotice } from "@/components/safety-notice";
import type { Locale } from "@/lib/i18n/routing";
import { reviewClosesAt } from "@/lib/time/review-period";
import { areaAndZones } from "@/db/queries/setup-zones";
import { MapSettingsProvider } from "@/components/map/map-settings";
import { RealMap } from "@/components/map/real-map";
import type { ArealGeometry } from "@/lib/geo/areal";
import { mapSettings } from "@/server/map-settings";
import { latestStandingVersion } from "@/db/queries/reports";
import { eventPermitFor, getSessionUser } from "@/server/auth/guard";
import { LocaleLink as Link } from "@/components/locale-link";

/** Recording is open and the event's dates are now: the live board is worth a link. */
function isRunning(e: { status: string; startsAt: Date; endsAt: Date }): boolean {
  const now = Date.now();
  return e.status === "open" && e.startsAt.getTime() <= now && now <= e.endsAt.getTime();
}

/** The results, live board and review links a visitor's role allows, or none. */
async function memberRole(eventId: string): Promise<"coordinator" | null> {
  const user = await getSessionUser();
  if (!user) return null;
  try {
    await eventPermitFor(user, eventId, "coordinator");
    return "coordinator";
  } catch {
    return null;
  }
}

export const dynamic = "force-dynamic";

type Props = { params: Promise<{ locale: Locale; slug: string }> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  const { slug } = await params;
  const event = await getPublicEventBySlug(slug);
  return event ? { title: event.name } : {};
}

export default async function EventPage({ params }: Props) {
  const { locale, slug } = await params;
  setRequestLocale(locale);
  const event = await getPublicEventBySlug(slug);
  if (!event) notFound();
  const [t, tHabitat, tGroup, tHome, tMap, format, zoneRows, species, shapes, latest, role] = await Promise.all([
    getTranslations("Event"),
    getTranslations("Habitat"),
    getTranslations("TaxonGroup"),
    getTranslations("Home"),
    getTranslations("Map"),
    getFormatter(),
    listZones(event.id),
    speciesListSummary(event.id),
    areaAndZones(event.id),
    latestStandingVersion(event.id),
    memberRole(event.id),
  ]);
  const during = isRunning(event);
  const when = (d: Date) => format.dateTime(d, { dateStyle: "full", timeStyle: "short", timeZone: event.timeZone });

  return (
    <article className="space-y-8">
      <header className="space-y-2">
        <div className="flex flex-wrap items-center gap-3">
          <h1 className="text-3xl font-bold text-reed-900">{event.name}</h1>
          <EventStatusBadge status={event.status} />
        </div>
        <p className="text-ink-soft">{tHome("organisedBy", { organisation: event.organisationName })}</p>
        {event.description ? <p className="max-w-prose text-lg">{event.description}</p> : null}
        <dl className="mt-2 grid gap-1 sm:grid-cols-[auto_1fr] sm:gap-x-4">
          <dt className="font-semibold">{t("when")}</dt>
          <dd>
            {tHome("dates", { start: when(event.startsAt), end: when(event.endsAt) })}
            <span className="block text-sm text-ink-soft">{t("timeZone", { timeZone: event.timeZone })}</span>
          </dd>
          <dt className="font-semibold">{t("reviewPeriod")}</dt>
          <dd>
            {t("reviewPeriodUntil", {
              date: format.dateTime(reviewClosesAt(event), { dateStyle: "full", timeZone: event.timeZone }),
            })}
          </dd>
        </dl>
      </header>

      <nav aria-labelledby="links-title" className="space-y-2 rounded-lg border border-reed-200 bg-white/70 p-4">
        <h2 id="links-title" className="text-xl font-bold text-reed-900">
          {t("linksTitle")}
        </h2>
        <ul className="space-y-1">
          <li>
            {latest ? (
              <Link href={`/events/${event.slug}/reports/${latest}`} className="font-semibold text-reed-800 underline">
                {t("latestReport", { version: latest })}
              </Link>
            ) : (
              t("noReport")
            )}
          </li>
          {role ? (
            <li>
              <Link href={`/events/${event.slug}/results`} className="font-semibold text-reed-800 underline">
                {t("resultsLink")}
              </Link>
            </li>
          ) : null}
          {role && during ? (
            <li>
              <Link href={`/events/${event.slug}/live`} className="font-semibold text-reed-800 underline">
                {t("liveLink")}
              </Link>
            </li>
          ) : null}
        </ul>
      </nav>

      <SafetyNotice />

      <section aria-labelledby="zones-title" className="space-y-3">
        <h2 id="zones-title" className="text-2xl font-bold text-reed-900">
          {t("zonesTitle")}
        </h2>
        <p className="max-w-prose text-ink-soft">{t("zonesIntro")}</p>
        {shapes.area || shapes.zones.length ? (
          <MapSettingsProvider settings={mapSettings()}>
            <RealMap
              label={tMap("eventLabel")}
              area={shapes.area as ArealGeometry | null}
              zones={shapes.zones.map((z) => ({ id: z.id, name: z.name, geometry: z.geometry as ArealGeometry }))}
              className="h-80 w-full rounded-lg border border-reed-200"
              whenShown
            />
          </MapSettingsProvider>
        ) : null}
        {zoneRows.length === 0 ? (
          <p>{t("noZones")}</p>
        ) : (
          <ul className="grid gap-3 sm:grid-cols-2">
            {zoneRows.map((z) => (
              <li key={z.id} className="rounded-lg border border-reed-200 bg-white/70 p-3">
                <h3 className="font-bold">{z.name}</h3>
                <p className="text-sm">
                  {t("zoneHabitat", { habitat: tHabitat(z.habitat) })} ·{" "}
                  {format.number(z.areaHa, { maximumFractionDigits: 1 })} ha
                </p>
                {z.description ? <p className="text-sm text-ink-soft">{z.description}</p> : null}
              </li>
            ))}
          </ul>
        )}
      </section>

      <section aria-labelledby="species-title" className="space-y-3">
        <h2 id="species-title" className="text-2xl font-bold text-reed-900">
          {t("speciesTitle")}
        </h2>
        <p>{t("speciesCount", { count: species.total })}</p>
        {species.byGroup.length > 0 ? (
          <table className="w-full max-w-md text-start">
            <caption className="sr-only">{t("speciesByGroup")}</caption>
            <tbody>
              {species.byGroup.map((g) => (
                <tr key={g.group} className="border-b border-reed-100">
                  <th scope="row" className="py-1 font-normal">
                    {tGroup(g.group)}
                  </th>
                  <td className="py-1 text-end tabular-nums">{format.number(g.count)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        ) : null}
        {species.sensitive > 0 ? (
          <p className="max-w-prose text-sm text-ink-soft">{t("sensitiveNote", { count: species.sensitive })}</p>
        ) : null}
      </section>
    </article>
  );
}
