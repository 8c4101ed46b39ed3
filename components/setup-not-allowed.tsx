import { getTranslations } from "next-intl/server";
import { Link } from "@/lib/i18n/navigation";

/** What a person sees on a setup page they may not open (the list and every event's setup). */
export async function SetupNotAllowed() {
  const [t, tOrg] = await Promise.all([getTranslations("Setup"), getTranslations("Organisations")]);
  return (
    <div role="alert" className="max-w-prose space-y-2 rounded-lg border-2 border-signal bg-signal-soft p-4">
      <h1 className="text-2xl font-bold">{t("forbiddenTitle")}</h1>
      <p>{t("forbiddenBody")}</p>
      <Link href="/account" className="font-semibold underline">
        {t("toAccount")}
      </Link>
      <Link href="/organisations/new" className="block font-semibold underline">
        {tOrg("askLink")}
      </Link>
    </div>
  );
}
