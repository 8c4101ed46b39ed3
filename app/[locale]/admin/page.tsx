import type { Metadata } from "next";
import { getFormatter, getTranslations, setRequestLocale } from "next-intl/server";
import { listOrganisationsForAdmin } from "@/db/queries/admin";
import { listOrganisationRequests } from "@/db/queries/organisations";
import { Link } from "@/lib/i18n/navigation";
import type { Locale } from "@/lib/i18n/routing";
import { requirePageSiteAdmin } from "@/server/auth/page";
import { AdminAction } from "./_components/admin-action";

export const dynamic = "force-dynamic";
type Props = { params: Promise<{ locale: Locale }> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  const { locale } = await params;
  const t = await getTranslations({ locale, namespace: "Admin" });
  return { title: t("nav.organisations") };
}

// Organisations: the requests waiting for a decision, then every organisation (suspend, reinstate, its log).
export default async function AdminOrganisationsPage({ params }: Props) {
  const { locale } = await params;
  setRequestLocale(locale);
  if (!(await requirePageSiteAdmin(locale, "/admin"))) return null;
  const [t, tOrg, format, requests, orgs] = await Promise.all([
    getTranslations("Admin"),
    getTranslations("Organisations"),
    getFormatter(),
    listOrganisationRequests(),
    listOrganisationsForAdmin(),
  ]);
  const regions = new Intl.DisplayNames([locale], { type: "region" });
  const pending = requests.filter((r) => r.state === "pending");
  const decided = requests.filter((r) => r.state !== "pending").slice(0, 20);
  return (
    <div className="space-y-8">
      <h1 className="text-3xl font-bold text-reed-900">{t("nav.organisations")}</h1>
      <section aria-labelledby="pending-title" className="space-y-3">
        <h2 id="pending-title" className="text-2xl font-bold text-reed-900">
          {t("pendingTitle", { count: pending.length })}
        </h2>
        {pending.length === 0 ? <p>{t("noPending")}</p> : null}
        <ul className="space-y-3">
          {pending.map((r) => (
            <li key={r.id} aria-label={r.name} className="space-y-2 rounded-lg border border-reed-200 bg-white/70 p-3">
              <p className="text-lg font-semibold">{r.name}</p>
              <p className="text-sm">
                {t("requestDetails", {
                  who: r.requesterName ? `${r.requesterName} <${r.requesterEmail}>` : r.requesterEmail,
                  contact: r.contactEmail,
                  country: regions.of(r.country) ?? r.country,
                  date: format.dateTime(new Date(r.createdAt), { dateStyle: "medium", timeStyle: "short" }),
                })}
              </p>
              <p className="italic">{r.description}</p>
              <div className="flex flex-wrap gap-4">
                <AdminAction
                  url={`/api/admin/organisation-requests/${r.id}`}
                  body={{ decision: "approve", reason: "" }}
                  label={t("approve")}
                  primary
                />
                <AdminAction
                  url={`/api/admin/organisation-requests/${r.id}`}
                  body={{ decision: "decline" }}
                  reason={t("declineReason")}
                  label={t("decline")}
                />
              </div>
            </li>
          ))}
        </ul>
        {decided.length ? (
          <details>
            <summary className="cursor-pointer font-semibold">{t("decidedTitle")}</summary>
            <ul className="ml-5 list-disc text-sm">
              {decided.map((r) => (
                <li key={r.id}>
                  {r.name}: {tOrg(`states.${r.state}`)}
                  {r.reason ? ` — ${r.reason}` : ""}
                </li>
              ))}
            </ul>
          </details>
        ) : null}
      </section>
      <section aria-labelledby="orgs-title" className="space-y-3">
        <h2 id="orgs-title" className="text-2xl font-bold text-reed-900">
          {t("organisationsTitle", { count: orgs.length })}
        </h2>
        <table className="w-full text-left text-sm">
          <caption className="sr-only">{t("organisationsTitle", { count: orgs.length })}</caption>
          <thead>
            <tr className="border-b border-reed-300">
              <th scope="col">{t("col.name")}</th>
              <th scope="col">{t("col.country")}</th>
              <th scope="col">{t("col.organisers")}</th>
              <th scope="col">{t("col.events")}</th>
              <th scope="col">{t("col.status")}</th>
              <th scope="col">{t("col.actions")}</th>
            </tr>
          </thead>
          <tbody>
            {orgs.map((o) => (
              <tr key={o.id} className="border-b border-reed-100 align-top">
                <th scope="row" className="py-2 font-semibold">
                  <Link href={`/organisations/${o.id}`} className="underline">
                    {o.name}
                  </Link>
                </th>
                <td>{o.country ? (regions.of(o.country) ?? o.country) : "—"}</td>
                <td>{o.organisers}</td>
                <td>{o.events}</td>
                <td>{o.suspendedAt ? t("suspended") : t("active")}</td>
                <td className="py-2">
                  {o.suspendedAt ? (
                    <AdminAction
                      url={`/api/admin/organisations/${o.id}`}
                      method="PATCH"
                      body={{ suspended: false, reason: "" }}
                      label={t("reinstate")}
                    />
                  ) : (
                    <AdminAction
                      url={`/api/admin/organisations/${o.id}`}
                      method="PATCH"
                      body={{ suspended: true }}
                      reason={t("suspendReason")}
                      label={t("suspend")}
                    />
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </section>
    </div>
  );
}
