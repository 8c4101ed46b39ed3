import { createTranslator } from "next-intl";
import en from "@/messages/en.json";
import es from "@/messages/es.json";
import fr from "@/messages/fr.json";
import ar from "@/messages/ar.json";
import { isLocale, routing, type Locale } from "./routing";

// For texts made outside a page (e-mails, API answers), where next-intl's request
// config is not in play.
export const catalogues = { en, es, fr, ar } as const;

export function toLocale(value: string | null | undefined): Locale {
  return value && isLocale(value) ? value : routing.defaultLocale;
}

export function translator<N extends keyof typeof en>(locale: Locale, namespace: N) {
  return createTranslator({ locale, messages: catalogues[locale], namespace });
}
