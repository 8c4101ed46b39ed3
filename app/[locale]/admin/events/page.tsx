import { getFormatter, getTranslations, setRequestLocale } from "next-intl/server";
import { EventStatusBadge } from "@/components/event-status-badge";
import { listAllEvents } from "@/db/queries/admin";
import { Link } from "@/lib/i18n/navigation";
import type { Locale } from "@/lib/i18n/routing";
import { requirePageSiteAdmin } from "@/server/auth/page";

export const dynamic = "force-dynamic";

// Every event on the site, newest first.
export default async function AdminEventsPage({ params }: { params: Promise<{ locale: Locale }> }) {
  const { locale } = await params;
  setRequestLocale(locale);
  if (!(await requirePageSiteAdmin(locale, "/admin/events"))) return null;
  const [t, format, events] = await Promise.all([getTranslations("Admin"), getFormatter(), listAllEvents()]);
  return (
    <div className="space-y-4">
      <h1 className="text-3xl font-bold text-reed-900">{t("nav.events")}</h1>
      <table className="w-full text-left text-sm">
        <caption className="sr-only">{t("nav.events")}</caption>
        <thead>
          <tr className="border-b border-reed-300">
            <th scope="col">{t("col.event")}</th>
            <th scope="col">{t("col.organisation")}</th>
            <th scope="col">{t("col.starts")}</th>
            <th scope="col">{t("col.sightings")}</th>
            <th scope="col">{t("col.status")}</th>
          </tr>
        </thead>
        <tbody>
          {events.map((e) => (
            <tr key={e.id} className="border-b border-reed-100">
              <th scope="row" className="py-2">
                <Link href={`/events/${e.slug}/setup`} className="underline">
                  {e.name}
                </Link>
              </th>
              <td>{e.organisation}</td>
              <td>{format.dateTime(new Date(e.startsAt), { dateStyle: "medium", timeZone: e.timeZone })}</td>
              <td>{e.sightings}</td>
              <td>
                <EventStatusBadge status={e.status as never} />
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
