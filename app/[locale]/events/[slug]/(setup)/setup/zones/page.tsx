import { setRequestLocale } from "next-intl/server";
import type { Locale } from "@/lib/i18n/routing";
import { setupPermit } from "../_components/setup-guard";
import { ZonesPanel } from "../_components/zones-panel";
import { MapSettingsProvider } from "@/components/map/map-settings";
import { mapSettings } from "@/server/map-settings";

export const dynamic = "force-dynamic";

export default async function ZonesPage({ params }: { params: Promise<{ locale: Locale; slug: string }> }) {
  const { locale, slug } = await params;
  setRequestLocale(locale);
  const permit = await setupPermit(locale, slug, "/zones");
  if (!permit) return null; // the layout shows why
  const { eventId } = permit;
  return (
    <MapSettingsProvider settings={mapSettings()}>
      <ZonesPanel eventId={eventId} />
    </MapSettingsProvider>
  );
}
