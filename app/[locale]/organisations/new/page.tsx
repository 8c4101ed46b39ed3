import type { Metadata } from "next";
import { getFormatter, getTranslations, setRequestLocale } from "next-intl/server";
import { myOrganisationRequests } from "@/db/queries/organisations";
import { Link } from "@/lib/i18n/navigation";
import type { Locale } from "@/lib/i18n/routing";
import { COUNTRY_CODES } from "@/lib/organisations/request";
import { requirePageUser } from "@/server/auth/page";
import { RequestForm } from "./request-form";

export const dynamic = "force-dynamic";

type Props = { params: Promise<{ locale: Locale }> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  const { locale } = await params;
  const t = await getTranslations({ locale, namespace: "Organisations" });
  return { title: t("requestTitle") };
}

// A signed-in person asks for a new organisation, and sees what became of their requests.
export default async function NewOrganisationPage({ params }: Props) {
  const { locale } = await params;
  setRequestLocale(locale);
  const user = await requirePageUser(locale, "/organisations/new");
  const [t, format, requests] = await Promise.all([
    getTranslations("Organisations"),
    getFormatter(),
    myOrganisationRequests(user.id),
  ]);
  const regions = new Intl.DisplayNames([locale], { type: "region" });
  const countries = COUNTRY_CODES.map((code) => ({ code, name: regions.of(code) ?? code })).sort((a, b) =>
    a.name.localeCompare(b.name, locale),
  );
  return (
    <div className="space-y-8">
      <header className="space-y-1">
        <h1 className="text-3xl font-bold text-reed-900">{t("requestTitle")}</h1>
        <p className="max-w-prose">{t("requestIntro")}</p>
      </header>
      <RequestForm countries={countries} defaultEmail={user.email} />
      <section aria-labelledby="my-requests" className="space-y-2">
        <h2 id="my-requests" className="text-2xl font-bold text-reed-900">
          {t("myRequests")}
        </h2>
        {requests.length === 0 ? (
          <p>{t("noRequests")}</p>
        ) : (
          <ul className="space-y-2">
            {requests.map((r) => (
              <li key={r.id} className="rounded-lg border border-reed-200 bg-white/70 p-3">
                {t("requestLine", {
                  name: r.name,
                  country: regions.of(r.country) ?? r.country,
                  date: format.dateTime(r.createdAt, { dateStyle: "medium" }),
                  state: t(`states.${r.state}`),
                })}
                {r.state === "declined" && r.reason ? (
                  <span className="block text-sm">{t("declinedReason", { reason: r.reason })}</span>
                ) : null}
                {r.state === "approved" ? (
                  <Link href="/setup" className="block font-semibold underline">
                    {t("openSetup")}
                  </Link>
                ) : null}
              </li>
            ))}
          </ul>
        )}
      </section>
    </div>
  );
}
