import { setRequestLocale } from "next-intl/server";
import type { Locale } from "@/lib/i18n/routing";
import { EventDetailsForm } from "../../_components/event-details-form";
import { setupPermit } from "../../_components/setup-guard";

export const dynamic = "force-dynamic";

export default async function EventDetailsPage({ params }: { params: Promise<{ locale: Locale; eventId: string }> }) {
  const { locale, eventId } = await params;
  setRequestLocale(locale);
  if (!(await setupPermit(locale, eventId, ""))) return null; // the layout shows why
  return <EventDetailsForm eventId={eventId} />;
}
