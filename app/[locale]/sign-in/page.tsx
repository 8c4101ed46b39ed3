import { getTranslations, setRequestLocale } from "next-intl/server";
import { callbackOrAccount } from "@/lib/auth/callback-url";
import { env } from "@/lib/env";
import type { Locale } from "@/lib/i18n/routing";
import { SignInForms } from "./_components/sign-in-forms";

type Props = { params: Promise<{ locale: Locale }>; searchParams: Promise<{ callbackUrl?: string; error?: string }> };

/** Only normalised paths on this site are followed after sign-in (lib/auth/callback-url.ts). */
const safeCallback = (locale: Locale, raw: string | undefined) => callbackOrAccount(raw, env().APP_URL, locale);

export default async function SignInPage({ params, searchParams }: Props) {
  const { locale } = await params;
  setRequestLocale(locale);
  const { callbackUrl, error } = await searchParams;
  const t = await getTranslations("SignIn");
  return (
    <div className="mx-auto max-w-3xl space-y-4">
      <h1 className="text-3xl font-bold text-reed-900">{t("title")}</h1>
      <p className="text-lg text-ink-soft">{t("intro")}</p>
      <SignInForms callbackUrl={safeCallback(locale, callbackUrl)} initialError={error ?? null} />
    </div>
  );
}
