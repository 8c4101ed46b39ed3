import { setRequestLocale } from "next-intl/server";
import type { Locale } from "@/lib/i18n/routing";
import { ApiTokensPanel } from "../_components/api-tokens-panel";
import { setupPermit } from "../_components/setup-guard";

export const dynamic = "force-dynamic";

export default async function ApiTokensPage({ params }: { params: Promise<{ locale: Locale; slug: string }> }) {
  const { locale, slug } = await params;
  setRequestLocale(locale);
  const permit = await setupPermit(locale, slug, "/api");
  if (!permit) return null; // the layout shows why
  return <ApiTokensPanel eventId={permit.eventId} referenceUrl={`/${locale}/api-reference`} />;
}
