import { setRequestLocale } from "next-intl/server";
import type { Locale } from "@/lib/i18n/routing";
import { EventDetailsForm } from "./_components/event-details-form";
import { setupPermit } from "./_components/setup-guard";

export const dynamic = "force-dynamic";

export default async function EventDetailsPage({ params }: { params: Promise<{ locale: Locale; slug: string }> }) {
  const { locale, slug } = await params;
  setRequestLocale(locale);
  const permit = await setupPermit(locale, slug, "");
  if (!permit) return null; // the layout shows why
  const { eventId } = permit;
  return <EventDetailsForm eventId={eventId} />;
}
