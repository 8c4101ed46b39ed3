import { getTranslations, setRequestLocale } from "next-intl/server";
import type { ReactNode } from "react";
import { eventForSetup } from "@/db/queries/setup";
import { EventStatusBadge } from "@/components/event-status-badge";
import { Link } from "@/lib/i18n/navigation";
import { ClientMessages } from "@/components/client-messages";
import type { Locale } from "@/lib/i18n/routing";
import { SetupNotAllowed as NotAllowed } from "@/components/setup-not-allowed";
import { setupPermit } from "./_components/setup-guard";
import { SetupTabs } from "./_components/setup-tabs";

type Props = { children: ReactNode; params: Promise<{ locale: Locale; slug: string }> };

export default async function EventSetupLayout({ children, params }: Props) {
  const { locale, slug } = await params;
  setRequestLocale(locale);
  const permit = await setupPermit(locale, slug, "");
  if (!permit) return <NotAllowed />;
  const [t, event] = await Promise.all([getTranslations("Setup"), eventForSetup(permit.eventId)]);
  if (!event) return <NotAllowed />;
  return (
    <div className="space-y-6">
      <header className="space-y-1">
        <p className="text-sm text-ink-soft">
          <Link href="/setup" className="underline">
            {t("title")}
          </Link>{" "}
          · {event.organisationName}
        </p>
        <div className="flex flex-wrap items-center gap-3">
          <h1 className="text-3xl font-bold text-reed-900">{event.name}</h1>
          <EventStatusBadge status={event.status} />
        </div>
        {event.status !== "draft" ? (
          <Link href={`/events/${event.slug}`} className="text-sm underline">
            {t("publicPage")}
          </Link>
        ) : null}
      </header>
      <SetupTabs
        slug={slug}
        label={t("tabs.label")}
        tabs={[
          { part: "", name: t("tabs.details") },
          { part: "zones", name: t("tabs.zones") },
          { part: "species", name: t("tabs.species") },
          { part: "people", name: t("tabs.people") },
          { part: "api", name: t("tabs.api") },
        ]}
      />
      {/* The messages the set-up's client components read (components/client-messages.tsx). */}
      <ClientMessages
        namespaces={[
          "Setup",
          "Habitat",
          "Map",
          "LocaleSwitcher",
          "Role",
          "TaxonGroup",
          "Home",
          "PaperSheets",
          "ApiTokens",
        ]}
      >
        {children}
      </ClientMessages>
    </div>
  );
}
