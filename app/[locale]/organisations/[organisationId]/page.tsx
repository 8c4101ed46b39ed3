import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { getTranslations, setRequestLocale } from "next-intl/server";
import { organisationById } from "@/db/queries/organisations";
import { ApiError } from "@/lib/http/errors";
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

// An organisation's organisers and its log (its organisers, site admins).
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
  const org = await organisationById(organisationId);
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
    </div>
  );
}
