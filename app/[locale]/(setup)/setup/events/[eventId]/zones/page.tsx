import { setRequestLocale } from "next-intl/server";
import type { Locale } from "@/lib/i18n/routing";
import { setupPermit } from "../../../_components/setup-guard";
import { ZonesPanel } from "../../../_components/zones-panel";

export const dynamic = "force-dynamic";

export default async function ZonesPage({ params }: { params: Promise<{ locale: Locale; eventId: string }> }) {
  const { locale, eventId } = await params;
  setRequestLocale(locale);
  if (!(await setupPermit(locale, eventId, "/zones"))) return null; // the layout shows why
  return <ZonesPanel eventId={eventId} />;
}
