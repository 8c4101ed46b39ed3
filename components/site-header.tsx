import { getLocale, getTranslations } from "next-intl/server";
import { organisesAnything } from "@/db/queries/setup";
import { getSessionUser } from "@/server/auth/guard";
import Link from "next/link";
import { locales, type Locale } from "@/lib/i18n/routing";
import { EcotoneMark } from "./ecotone-mark";
import { HeaderMenu } from "./header-menu";
import { LocaleSwitcher } from "./locale-switcher";
import { SignOutButton } from "./sign-out-button";

export async function SiteHeader() {
  const [t, tNav, tLang, tSign, user, locale] = await Promise.all([
    getTranslations("Common"),
    getTranslations("Nav"),
    getTranslations("LocaleSwitcher"),
    getTranslations("SignIn"),
    getSessionUser(),
    getLocale() as Promise<Locale>,
  ]);
  // Next's own Link with the locale in the path, and the client parts given their texts: the header
  // adds no i18n client code to a page's first load (issue 18).
  const to = (path: string) => `/${locale}${path === "/" ? "" : path}`;
  const organiser = user ? user.isAdmin || (await organisesAnything(user.id)) : false;
  const link = "inline-flex min-h-touch items-center rounded-md px-2 font-semibold underline-offset-4 hover:underline";
  return (
    <header className="border-b-4 border-heath-400 bg-reed-800 text-paper">
      <div className="mx-auto flex max-w-5xl flex-wrap items-center justify-between gap-x-3 gap-y-1 px-4 py-1 sm:py-2">
        <Link href={to("/")} className="flex min-h-touch items-center gap-2 text-lg font-bold tracking-tight">
          <EcotoneMark />
          <span>{t("appName")}</span>
        </Link>
        <nav aria-label={tNav("menu")} className="relative flex flex-wrap items-center gap-1">
          <HeaderMenu label={tNav("menu")}>
            <Link href={to("/")} className={link}>
              {tNav("events")}
            </Link>
            {user ? (
              <>
                {organiser ? (
                  <Link href={to("/setup")} className={link}>
                    {tNav("setup")}
                  </Link>
                ) : null}
                {/* A full page load, so the service worker can answer it without a network. */}
                <a href={`/${locale}/field`} className={link}>
                  {tNav("fieldLog")}
                </a>
                <Link href={to("/account")} className={link} title={user.email}>
                  {tNav("account")}
                </Link>
                <SignOutButton label={tSign("signOut")} locale={locale} />
              </>
            ) : (
              <Link href={to("/sign-in")} className={link}>
                {tNav("signIn")}
              </Link>
            )}
            <div className="[&_select]:border-paper [&_select]:bg-reed-800 [&_select]:text-paper">
              <LocaleSwitcher
                locale={locale}
                label={tLang("label")}
                names={Object.fromEntries(locales.map((l) => [l, tLang(l)])) as Record<Locale, string>}
              />
            </div>
          </HeaderMenu>
        </nav>
      </div>
    </header>
  );
}
