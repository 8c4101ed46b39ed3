import NextLink from "next/link";
import { getLocale } from "next-intl/server";
import type { ComponentProps } from "react";

/**
 * A link to a path of this site in the page's language (the path without its locale: "/events/…"),
 * for server components. Next's own Link with the locale in front: unlike next-intl's Link it
 * adds no client code of its own to the page's first load (issue 18).
 */
export async function LocaleLink({ href, ...rest }: Omit<ComponentProps<typeof NextLink>, "href"> & { href: string }) {
  const locale = await getLocale();
  return <NextLink href={`/${locale}${href === "/" ? "" : href}`} {...rest} />;
}
