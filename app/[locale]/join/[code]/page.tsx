import { getFormatter, getTranslations, setRequestLocale } from "next-intl/server";
import { eventByJoinCode } from "@/db/queries/setup";
import { SafetyNotice } from "@/components/safety-notice";
import { getSessionUser } from "@/server/auth/guard";
import { publishedNameOf } from "@/db/queries/my-data";
import type { Locale } from "@/lib/i18n/routing";
import { JoinForm } from "./_components/join-form";

export const dynamic = "force-dynamic";

// Public: the page a join link opens. Joining itself goes through POST /api/join.
export default async function JoinPage({ params }: { params: Promise<{ locale: Locale; code: string }> }) {
  const { locale, code } = await params;
  setRequestLocale(locale);
  const [t, format, event, user] = await Promise.all([
    getTranslations("Join"),
    getFormatter(),
    eventByJoinCode(decodeURIComponent(code).slice(0, 32)),
    getSessionUser(),
  ]);
  if (!event) {
    return (
      <div className="max-w-prose space-y-2">
        <h1 className="text-3xl font-bold text-reed-900">{t("title")}</h1>
        <p role="alert" className="font-semibold text-signal">
          ✕ {t("unknownCode")}
        </p>
      </div>
    );
  }
  return (
    <div className="max-w-3xl space-y-6">
      <header className="space-y-1">
        <h1 className="text-3xl font-bold text-reed-900">{t("joinEvent", { event: event.name })}</h1>
        <p className="text-ink-soft">{t("organisedBy", { organisation: event.organisationName })}</p>
      </header>
      {/* What the person joins, before they are asked for an address. */}
      <section className="space-y-2" data-testid="join-event">
        {event.description ? <p className="max-w-prose text-lg">{event.description}</p> : null}
        <dl className="grid gap-1 sm:grid-cols-[auto_1fr] sm:gap-x-4">
          <dt className="font-semibold">{t("when")}</dt>
          <dd>
            {t("dates", {
              start: format.dateTime(event.startsAt, {
                dateStyle: "full",
                timeStyle: "short",
                timeZone: event.timeZone,
              }),
              end: format.dateTime(event.endsAt, { dateStyle: "full", timeStyle: "short", timeZone: event.timeZone }),
              timeZone: event.timeZone,
            })}
          </dd>
          <dt className="font-semibold">{t("where")}</dt>
          <dd>{event.zoneNames.length ? t("zones", { zones: event.zoneNames.join(", ") }) : t("noZones")}</dd>
        </dl>
        {event.status === "draft" ? (
          <p role="note" className="font-semibold">
            {t("notOpenYet", {
              start: format.dateTime(event.startsAt, { dateStyle: "long", timeZone: event.timeZone }),
            })}
          </p>
        ) : null}
      </section>
      {event.status === "closed" ? (
        <p role="alert" className="font-semibold text-signal">
          ✕ {t("closed")}
        </p>
      ) : (
        <JoinForm
          code={decodeURIComponent(code).slice(0, 32)}
          locale={locale}
          signedInAs={user?.email ?? null}
          eventSlug={event.slug}
          publishedName={user ? (await publishedNameOf(user.id)).name : null}
        />
      )}
      <SafetyNotice />
    </div>
  );
}
