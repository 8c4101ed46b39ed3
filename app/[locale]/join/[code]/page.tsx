import { getTranslations, setRequestLocale } from "next-intl/server";
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
  const [t, event, user] = await Promise.all([
    getTranslations("Join"),
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
