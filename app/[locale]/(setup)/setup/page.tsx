import { getFormatter, getTranslations, setRequestLocale } from "next-intl/server";
import { organisationsForSetup } from "@/db/queries/setup";
import { EventStatusBadge } from "@/components/event-status-badge";
import { requirePageUser } from "@/server/auth/page";
import { Link } from "@/lib/i18n/navigation";
import type { Locale } from "@/lib/i18n/routing";
import { CreateEventForm } from "./_components/create-event-form";
import { SetupNotAllowed as NotAllowed } from "@/components/setup-not-allowed";

export const dynamic = "force-dynamic";

export default async function SetupHome({ params }: { params: Promise<{ locale: Locale }> }) {
  const { locale } = await params;
  setRequestLocale(locale);
  const user = await requirePageUser(locale, "/setup");
  const [t, tOrg, format, orgs] = await Promise.all([
    getTranslations("Setup"),
    getTranslations("Organisations"),
    getFormatter(),
    organisationsForSetup(user.id, user.isAdmin),
  ]);
  if (orgs.length === 0) return <NotAllowed />;
  const creatable = orgs.filter((o) => o.canCreate).map((o) => ({ id: o.id, name: o.name }));
  return (
    <div className="space-y-8">
      <header>
        <h1 className="text-3xl font-bold text-reed-900">{t("title")}</h1>
        <p className="text-lg text-ink-soft">{t("intro")}</p>
      </header>
      {orgs.map((o) => (
        <section key={o.id} aria-labelledby={`org-${o.id}`} className="space-y-2">
          <h2 id={`org-${o.id}`} className="text-2xl font-bold text-reed-900">
            {o.name}
          </h2>
          {o.canCreate ? (
            <Link href={`/organisations/${o.id}`} className="text-sm font-semibold underline">
              {tOrg("organisersLink")}
            </Link>
          ) : null}
          {o.events.length === 0 ? (
            <p>{t("noEvents")}</p>
          ) : (
            <ul className="grid gap-2 sm:grid-cols-2">
              {o.events.map((e) => (
                <li
                  key={e.id}
                  className="flex flex-wrap items-center justify-between gap-2 rounded-lg border border-reed-200 bg-white/70 p-3"
                >
                  <span>
                    <Link href={`/events/${e.slug}/setup`} className="font-semibold text-reed-800 underline">
                      {e.name}
                    </Link>
                    <span className="block text-sm text-ink-soft">
                      {format.dateTime(e.startsAt, { dateStyle: "medium", timeZone: e.timeZone })}
                    </span>
                  </span>
                  <EventStatusBadge status={e.status} />
                </li>
              ))}
            </ul>
          )}
        </section>
      ))}
      {creatable.length ? <CreateEventForm organisations={creatable} locale={locale} /> : null}
      <p>
        <Link href="/organisations/new" className="font-semibold underline">
          {tOrg("askLink")}
        </Link>
      </p>
    </div>
  );
}
