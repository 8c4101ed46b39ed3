import { getFormatter, getTranslations, setRequestLocale } from "next-intl/server";
import { listPublicEvents } from "@/db/queries/events";
import { EventStatusBadge } from "@/components/event-status-badge";
import { Link } from "@/lib/i18n/navigation";
import type { Locale } from "@/lib/i18n/routing";

export const dynamic = "force-dynamic";

export default async function HomePage({ params }: { params: Promise<{ locale: Locale }> }) {
  const { locale } = await params;
  setRequestLocale(locale);
  const [t, format, events] = await Promise.all([getTranslations("Home"), getFormatter(), listPublicEvents()]);

  return (
    <div className="space-y-6">
      <div>
        <h1 className="text-3xl font-bold text-reed-900">{t("title")}</h1>
        <p className="mt-1 text-lg text-ink-soft">{t("intro")}</p>
      </div>
      {events.length === 0 ? (
        <p className="rounded-lg border border-dashed border-reed-300 p-6 text-center">{t("empty")}</p>
      ) : (
        <ul className="grid gap-4 sm:grid-cols-2">
          {events.map((e) => (
            <li key={e.id} className="flex flex-col rounded-xl border border-reed-200 bg-white/70 p-4 shadow-sm">
              <div className="flex flex-wrap items-start justify-between gap-2">
                <h2 className="text-xl font-bold text-reed-900">{e.name}</h2>
                <EventStatusBadge status={e.status} />
              </div>
              <p className="text-ink-soft">{t("organisedBy", { organisation: e.organisationName })}</p>
              <p className="mt-2 font-semibold">
                {t("dates", {
                  start: format.dateTime(e.startsAt, { dateStyle: "medium", timeZone: e.timeZone }),
                  end: format.dateTime(e.endsAt, { dateStyle: "medium", timeZone: e.timeZone }),
                })}
              </p>
              <p className="text-ink-soft">
                {t("zones", { count: e.zoneCount })} · {t("species", { count: e.speciesCount })}
              </p>
              <Link
                href={`/events/${e.slug}`}
                className="mt-4 inline-flex min-h-touch items-center justify-center self-start rounded-lg bg-reed-700 px-4 font-semibold text-paper hover:bg-reed-800"
                aria-label={`${t("open")}: ${e.name}`}
              >
                {t("open")}
              </Link>
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
