import type { Metadata } from "next";
import { getTranslations, setRequestLocale } from "next-intl/server";
import { fieldLogEvents } from "@/db/queries/field-log";
import { SafetyNotice } from "@/components/safety-notice";
import { requirePageUser } from "@/server/auth/page";
import type { Locale } from "@/lib/i18n/routing";
import { FieldApp } from "./_components/field-app";
import { MapSettingsProvider } from "@/components/map/map-settings";
import { mapSettings } from "@/server/map-settings";

export const dynamic = "force-dynamic";

type Props = { params: Promise<{ locale: Locale }> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  const { locale } = await params;
  const t = await getTranslations({ locale, namespace: "FieldLog" });
  return { title: t("title") };
}

// The field log: a shell that the service worker keeps for use without a network. The
// events listed here are the person's own; everything else (species, zones, records)
// comes from IndexedDB and the guarded API handlers.
export default async function FieldLogPage({ params }: Props) {
  const { locale } = await params;
  setRequestLocale(locale);
  const user = await requirePageUser(locale, "/field");
  const [t, events] = await Promise.all([getTranslations("FieldLog"), fieldLogEvents(user.id)]);
  return (
    <div className="mx-auto max-w-xl space-y-6 pb-28">
      <h1 className="text-2xl font-bold text-reed-900">{t("title")}</h1>
      {/* The log is drawn from the phone's storage after the page loads: its room is kept from the
          start so the safety notice below does not jump down when it appears (layout shift, issue 18). */}
      <div className="min-h-svh">
        <MapSettingsProvider settings={mapSettings()}>
          <FieldApp locale={locale} events={events} />
        </MapSettingsProvider>
      </div>
      <div id="safety">
        <SafetyNotice />
      </div>
    </div>
  );
}
