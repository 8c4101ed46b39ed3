import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { getTranslations, setRequestLocale } from "next-intl/server";
import { organisationById, organisationEventMembers } from "@/db/queries/organisations";
import { ApiError } from "@/lib/http/errors";
import { Link } from "@/lib/i18n/navigation";
import { isUuid } from "@/lib/http/params";
import type { Locale } from "@/lib/i18n/routing";
import { requireOrganisationOrganiser } from "@/server/auth/guard";
import { requirePageUser } from "@/server/auth/page";
import { OrganisersPanel } from "./organisers-panel";

export const dynamic = "force-dynamic";

type Props = { params: Promise<{ locale: Locale; organisationId: string }> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  const { locale } = await params;
  const t = await getTranslations({ locale, namespace: "Organisations" });
  return { title: t("organisersLink") };
}

// An organisation's organisers, its log and every event's members (its organisers, site admins).
export default async function OrganisationPage({ params }: Props) {
  const { locale, organisationId } = await params;
  setRequestLocale(locale);
  const user = await requirePageUser(locale, `/organisations/${organisationId}`);
  if (!isUuid(organisationId)) notFound();
  const t = await getTranslations("Organisations");
  try {
    await requireOrganisationOrganiser(organisationId);
  } catch (err) {
    if (!(err instanceof ApiError)) throw err;
    return (
      <p role="alert" className="rounded-lg border-2 border-signal bg-signal-soft p-4 font-semibold text-signal">
        {t("notAllowed")}
      </p>
    );
  }
  const [org, events, tRole, tGroup] = await Promise.all([
    organisationById(organisationId),
    organisationEventMembers(organisationId),
    getTranslations("Role"),
    getTranslations("TaxonGroup"),
  ]);
  if (!org) notFound();
  return (
    <div className="space-y-6">
      <header className="space-y-1">
        <h1 className="text-3xl font-bold text-reed-900">{t("organisersTitle", { name: org.name })}</h1>
        <p className="max-w-prose">{t("organisersIntro")}</p>
        {org.suspendedAt ? (
          <p role="note" className="rounded border-2 border-signal p-2 font-semibold">
            {t("suspendedNote")}
          </p>
        ) : null}
      </header>
      <OrganisersPanel organisationId={organisationId} selfId={user.id} />
      <section aria-labelledby="event-members-title" className="space-y-3">
        <h2 id="event-members-title" className="text-2xl font-bold text-reed-900">
          {t("eventMembersTitle")}
        </h2>
        {events.length === 0 ? <p>{t("noEvents")}</p> : null}
        {events.map((e) => (
          <section key={e.eventId} aria-label={e.eventName} className="space-y-1">
            <h3 className="text-lg font-semibold">
              <Link href={`/events/${e.slug}/setup/people`} className="underline">
                {e.eventName}
              </Link>{" "}
              <span className="text-sm font-normal">({t("memberCount", { count: e.members.length })})</span>
            </h3>
            {e.members.length === 0 ? (
              <p className="text-sm">{t("noEventMembers")}</p>
            ) : (
              <ul className="ms-5 list-disc text-sm">
                {e.members.map((m) => (
                  <li key={m.userId}>
                    {m.name ? `${m.name} <${m.email}>` : m.email}: {tRole(m.role)}
                    {m.taxonGroups.length ? ` (${m.taxonGroups.map((g) => tGroup(g)).join(", ")})` : ""}
                  </li>
                ))}
              </ul>
            )}
          </section>
        ))}
      </section>
    </div>
  );
}
