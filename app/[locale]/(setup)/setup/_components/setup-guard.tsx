import { getTranslations } from "next-intl/server";
import { requirePageEventRole } from "@/server/auth/page";
import { Link } from "@/lib/i18n/navigation";
import type { Locale } from "@/lib/i18n/routing";

/** Every setup page of an event: organisers (and site admins) only, through the one guard. */
export async function setupPermit(locale: Locale, eventId: string, path: string) {
  return requirePageEventRole(locale, eventId, "organiser", `/setup/events/${eventId}${path}`);
}

export async function NotAllowed() {
  const t = await getTranslations("Setup");
  return (
    <div role="alert" className="max-w-prose space-y-2 rounded-lg border-2 border-signal bg-signal-soft p-4">
      <h1 className="text-2xl font-bold">{t("forbiddenTitle")}</h1>
      <p>{t("forbiddenBody")}</p>
      <Link href="/account" className="font-semibold underline">{t("toAccount")}</Link>
    </div>
  );
}
