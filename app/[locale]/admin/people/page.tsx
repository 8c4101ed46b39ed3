import { getFormatter, getTranslations, setRequestLocale } from "next-intl/server";
import { searchPeople } from "@/db/queries/admin";
import { buttonClass, inputClass } from "@/components/ui/field";
import type { Locale } from "@/lib/i18n/routing";
import { requirePageSiteAdmin } from "@/server/auth/page";
import { AdminAction } from "../_components/admin-action";
import { EraseAccount } from "../_components/erase-account";

export const dynamic = "force-dynamic";

// People: search by address or name; lock or unlock an account, end its sessions, erase it.
export default async function AdminPeoplePage({
  params,
  searchParams,
}: {
  params: Promise<{ locale: Locale }>;
  searchParams: Promise<{ q?: string | string[] }>;
}) {
  const { locale } = await params;
  setRequestLocale(locale);
  const admin = await requirePageSiteAdmin(locale, "/admin/people");
  if (!admin) return null;
  const raw = (await searchParams).q;
  const q = (Array.isArray(raw) ? raw[0] : raw)?.slice(0, 200) ?? "";
  const [t, format, people] = await Promise.all([getTranslations("Admin"), getFormatter(), searchPeople(q)]);
  return (
    <div className="space-y-4">
      <h1 className="text-3xl font-bold text-reed-900">{t("nav.people")}</h1>
      <form role="search" method="get" className="flex flex-wrap items-end gap-2">
        <span>
          <label htmlFor="people-q" className="block font-semibold">
            {t("searchLabel")}
          </label>
          <input id="people-q" name="q" defaultValue={q} className={`${inputClass} w-72`} />
        </span>
        <button type="submit" className={buttonClass}>
          {t("search")}
        </button>
      </form>
      <table className="w-full text-left text-sm">
        <caption className="sr-only">{t("nav.people")}</caption>
        <thead>
          <tr className="border-b border-reed-300">
            <th scope="col">{t("col.person")}</th>
            <th scope="col">{t("col.since")}</th>
            <th scope="col">{t("col.status")}</th>
            <th scope="col">{t("col.actions")}</th>
          </tr>
        </thead>
        <tbody>
          {people.map((p) => (
            <tr key={p.id} className="border-b border-reed-100 align-top">
              <th scope="row" className="py-2 font-normal">
                <span className="font-semibold">{p.name ?? p.email}</span> <span className="block">{p.email}</span>
              </th>
              <td>{format.dateTime(new Date(p.createdAt), { dateStyle: "medium" })}</td>
              <td>{p.erasedAt ? t("erased") : p.lockedAt ? t("locked") : p.isAdmin ? t("siteAdmin") : t("active")}</td>
              <td className="space-y-1 py-2">
                {p.erasedAt ? null : p.id === admin.id ? null : p.lockedAt ? (
                  <AdminAction url={`/api/admin/people/${p.id}`} body={{ action: "unlock" }} label={t("unlock")} />
                ) : (
                  <AdminAction
                    url={`/api/admin/people/${p.id}`}
                    body={{ action: "lock" }}
                    reason={t("lockReason")}
                    label={t("lock")}
                  />
                )}{" "}
                {p.erasedAt ? null : (
                  <AdminAction
                    url={`/api/admin/people/${p.id}`}
                    body={{ action: "end_sessions" }}
                    label={t("endSessions")}
                  />
                )}
                {p.erasedAt || p.id === admin.id ? null : <EraseAccount userId={p.id} email={p.email} />}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      {people.length === 0 ? <p>{t("noPeople")}</p> : null}
    </div>
  );
}
