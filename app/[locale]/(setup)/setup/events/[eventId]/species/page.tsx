import { setRequestLocale } from "next-intl/server";
import type { Locale } from "@/lib/i18n/routing";
import { setupPermit } from "../../../_components/setup-guard";
import { SpeciesPanel } from "../../../_components/species-panel";

export const dynamic = "force-dynamic";

export default async function SpeciesPage({ params }: { params: Promise<{ locale: Locale; eventId: string }> }) {
  const { locale, eventId } = await params;
  setRequestLocale(locale);
  if (!(await setupPermit(locale, eventId, "/species"))) return null; // the layout shows why
  return <SpeciesPanel eventId={eventId} locale={locale} />;
}
