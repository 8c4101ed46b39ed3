import { setRequestLocale } from "next-intl/server";
import { env } from "@/lib/env";
import type { Locale } from "@/lib/i18n/routing";
import { PeoplePanel } from "../_components/people-panel";
import { setupPermit } from "../_components/setup-guard";

export const dynamic = "force-dynamic";

export default async function PeoplePage({ params }: { params: Promise<{ locale: Locale; slug: string }> }) {
  const { locale, slug } = await params;
  setRequestLocale(locale);
  const permit = await setupPermit(locale, slug, "/people");
  if (!permit) return null; // the layout shows why
  const { eventId } = permit;
  return <PeoplePanel eventId={eventId} locale={locale} joinUrlBase={`${env().APP_URL}/${locale}/join`} />;
}
