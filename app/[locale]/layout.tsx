import "../globals.css";
import type { Metadata, Viewport } from "next";
import localFont from "next/font/local";
import { notFound } from "next/navigation";
import { hasLocale } from "next-intl";
import { getTranslations, setRequestLocale } from "next-intl/server";
import type { ReactNode } from "react";
import { ClientMessages } from "@/components/client-messages";
import { SiteHeader } from "@/components/site-header";
import { routing, rtlLocales } from "@/lib/i18n/routing";

// Atkinson Hyperlegible Next: designed for legibility, which matters in sun and rain.
// Shipped from the npm package; nothing is fetched at build or run time.
const sans = localFont({
  src: "../../node_modules/@fontsource-variable/atkinson-hyperlegible-next/files/atkinson-hyperlegible-next-latin-wght-normal.woff2",
  variable: "--font-sans",
  weight: "200 800",
  display: "swap",
});

export function generateStaticParams() {
  return routing.locales.map((locale) => ({ locale }));
}

export async function generateMetadata({ params }: { params: Promise<{ locale: string }> }): Promise<Metadata> {
  const { locale } = await params;
  if (!hasLocale(routing.locales, locale)) return {};
  const t = await getTranslations({ locale, namespace: "Common" });
  return { title: { default: t("appName"), template: `%s · ${t("appName")}` }, description: t("tagline") };
}

export const viewport: Viewport = { themeColor: "#153a2a", width: "device-width", initialScale: 1 };

export default async function LocaleLayout({
  children,
  params,
}: {
  children: ReactNode;
  params: Promise<{ locale: string }>;
}) {
  const { locale } = await params;
  if (!hasLocale(routing.locales, locale)) notFound();
  setRequestLocale(locale);
  const t = await getTranslations({ locale, namespace: "Common" });

  return (
    <html lang={locale} dir={rtlLocales.includes(locale) ? "rtl" : "ltr"} className={sans.variable}>
      <body className="flex min-h-screen flex-col bg-paper font-sans text-ink antialiased">
        <a
          href="#main"
          className="sr-only focus:not-sr-only focus:absolute focus:start-2 focus:top-2 focus:z-50 focus:rounded focus:bg-paper focus:p-2"
        >
          {t("skipToContent")}
        </a>
        {/* The sign-out dialog's and the error page's messages; each part of the site adds its own (components/client-messages.tsx). */}
        <ClientMessages namespaces={["SignIn", "MyData", "Errors"]}>
          <SiteHeader />
          <main id="main" className="mx-auto w-full max-w-5xl flex-1 px-4 py-6">
            {children}
          </main>
        </ClientMessages>
        <footer className="border-t border-reed-200 px-4 py-4 text-center text-sm text-ink-soft">{t("footer")}</footer>
      </body>
    </html>
  );
}
