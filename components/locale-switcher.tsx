"use client";

import { usePathname, useRouter } from "next/navigation";
import { useTransition } from "react";
import { locales, type Locale } from "@/lib/i18n/routing";

/**
 * The language menu of the header. Its texts come translated from the server and it moves with
 * Next's own router (the path's first segment is the locale: localePrefix "always"), so the
 * header adds no translation or i18n-navigation code to a page's first load (issue 18).
 */
export function LocaleSwitcher({
  locale,
  label,
  names,
}: {
  locale: Locale;
  label: string;
  names: Record<Locale, string>;
}) {
  const router = useRouter();
  const pathname = usePathname();
  const [pending, startTransition] = useTransition();

  return (
    <label className="flex items-center gap-2 text-sm">
      <span className="sr-only sm:not-sr-only">{label}</span>
      <select
        className="min-h-touch rounded-md border border-reed-700 bg-paper px-2 text-ink disabled:opacity-60"
        value={locale}
        disabled={pending}
        onChange={(e) => {
          const next = e.target.value as Locale;
          // The locale cookie as next-intl's router sets it when switching (its default: NEXT_LOCALE, lax).
          document.cookie = `NEXT_LOCALE=${next};path=/;SameSite=lax`;
          const rest = pathname.split("/").slice(2).join("/");
          startTransition(() => {
            router.replace(`/${next}${rest ? `/${rest}` : ""}`);
          });
        }}
      >
        {locales.map((l) => (
          <option key={l} value={l} lang={l}>
            {names[l]}
          </option>
        ))}
      </select>
    </label>
  );
}
