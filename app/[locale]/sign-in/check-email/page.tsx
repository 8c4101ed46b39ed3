import { getTranslations, setRequestLocale } from "next-intl/server";
import { env } from "@/lib/env";
import type { Locale } from "@/lib/i18n/routing";

export default async function CheckEmailPage({ params }: { params: Promise<{ locale: Locale }> }) {
  const { locale } = await params;
  setRequestLocale(locale);
  const t = await getTranslations("SignIn");
  const inbox = env().MAIL_INBOX_URL;
  return (
    <div className="mx-auto max-w-xl space-y-3 rounded-xl border border-reed-200 bg-white/70 p-6">
      <h1 className="text-2xl font-bold text-reed-900">{t("checkTitle")}</h1>
      <p className="text-lg">{t("checkBody")}</p>
      {inbox ? <p className="text-ink-soft">{t("checkInbox", { url: inbox })}</p> : null}
    </div>
  );
}
