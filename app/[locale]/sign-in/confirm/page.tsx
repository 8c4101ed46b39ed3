import type { Metadata } from "next";
import { getTranslations, setRequestLocale } from "next-intl/server";
import { buttonClass } from "@/components/ui/field";
import { callbackOrAccount } from "@/lib/auth/callback-url";
import { env } from "@/lib/env";
import type { Locale } from "@/lib/i18n/routing";
import { emailCallbackAction } from "@/server/auth/magic-link";

type Props = {
  params: Promise<{ locale: Locale }>;
  searchParams: Promise<{ token?: string; email?: string; callbackUrl?: string }>;
};

// The page a mailed sign-in link opens. Opening it uses nothing up (mail scanners follow
// links); the button posts the one-time token to next-auth's e-mail callback.
// "same-origin": the token in this address never goes to another site, and the button's POST
// still carries our Origin (with "no-referrer" a browser sends "Origin: null", which is refused).
export const metadata: Metadata = { referrer: "same-origin", robots: { index: false, follow: false } };

export default async function ConfirmSignInPage({ params, searchParams }: Props) {
  const { locale } = await params;
  setRequestLocale(locale);
  const { token, email, callbackUrl } = await searchParams;
  const t = await getTranslations("SignIn");
  const valid =
    typeof token === "string" && /^[0-9a-f]{16,128}$/i.test(token) && typeof email === "string" && email.length <= 254;
  return (
    <div className="mx-auto max-w-xl space-y-4 rounded-xl border border-reed-200 bg-white/70 p-6">
      <h1 className="text-2xl font-bold text-reed-900">{t("confirmTitle")}</h1>
      {valid ? (
        <form
          method="post"
          action={emailCallbackAction({
            token,
            email,
            callbackUrl: callbackOrAccount(callbackUrl, env().APP_URL, locale),
          })}
          className="space-y-4"
        >
          <p className="text-lg">{t("confirmBody", { email })}</p>
          <button type="submit" className={buttonClass}>
            {t("confirmSubmit")}
          </button>
        </form>
      ) : (
        <p role="alert" className="text-lg">
          {t("errors.linkInvalid")}
        </p>
      )}
    </div>
  );
}
