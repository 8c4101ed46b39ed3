import { defineRouting } from "next-intl/routing";

export const locales = ["en", "es", "fr", "ar"] as const;

// Locales written right to left: the document gets dir="rtl".
export const rtlLocales: readonly Locale[] = ["ar"];
export type Locale = (typeof locales)[number];

export const routing = defineRouting({
  locales,
  defaultLocale: "en",
  localePrefix: "always",
});

export function isLocale(value: string): value is Locale {
  return (locales as readonly string[]).includes(value);
}
