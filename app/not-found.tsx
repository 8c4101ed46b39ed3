import { headers } from "next/headers";
import Link from "next/link";
import "./globals.css";
import { locales, rtlLocales, type Locale } from "@/lib/i18n/routing";
import { translator } from "@/lib/i18n/translator";

/** The first of the browser's languages (Accept-Language, in its order of preference) that we speak. */
function preferred(acceptLanguage: string | null): Locale {
  const asked = (acceptLanguage ?? "")
    .split(",")
    .map((part) => {
      const [tag, ...params] = part.trim().split(";");
      const q = params.map((p) => /^q=([\d.]+)$/.exec(p.trim())).find(Boolean);
      return { lang: (tag ?? "").toLowerCase().split("-")[0] ?? "", q: q ? Number(q[1]) : 1 };
    })
    .filter((a) => a.lang && a.q > 0)
    .sort((a, b) => b.q - a.q);
  return (asked.map((a) => a.lang).find((l) => (locales as readonly string[]).includes(l)) as Locale) ?? "en";
}

// Reached only for addresses outside any locale; the localised one is [locale]/not-found.
export default async function GlobalNotFound() {
  const locale = preferred((await headers()).get("accept-language"));
  const t = translator(locale, "NotFound");
  const common = translator(locale, "Common");
  return (
    <html lang={locale} dir={rtlLocales.includes(locale) ? "rtl" : "ltr"}>
      <body className="bg-paper p-8 font-sans text-ink">
        <main>
          <h1 className="text-2xl font-bold">{t("title")}</h1>
          <p className="mt-2">{t("body")}</p>
          <p className="mt-2">
            <Link className="text-reed-700 underline" href={`/${locale}`}>
              {common("appName")} — {t("back")}
            </Link>
          </p>
        </main>
      </body>
    </html>
  );
}
