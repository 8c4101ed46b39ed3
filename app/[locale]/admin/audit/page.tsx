import { getFormatter, getTranslations, setRequestLocale } from "next-intl/server";
import { z } from "zod";
import { AUDIT_SOURCES, auditLog } from "@/db/queries/admin";
import { buttonClass, inputClass } from "@/components/ui/field";
import { ADMIN_ACTIONS, type AdminAction } from "@/lib/domain";
import { Link } from "@/lib/i18n/navigation";
import type { Locale } from "@/lib/i18n/routing";
import { requirePageSiteAdmin } from "@/server/auth/page";

export const dynamic = "force-dynamic";

const one = (v: unknown) => (Array.isArray(v) ? v[0] : v);
const filters = z.object({
  source: z.preprocess(one, z.enum(AUDIT_SOURCES).optional().catch(undefined)),
  actor: z.preprocess(one, z.string().max(200).optional().catch(undefined)),
  from: z.preprocess(one, z.iso.date().optional().catch(undefined)),
  to: z.preprocess(one, z.iso.date().optional().catch(undefined)),
  page: z.preprocess(one, z.coerce.number().int().min(0).max(10_000).catch(0)),
});

// The audit view: the append-only logs (memberships, organisations, review decisions,
// publications, admin actions) as one list, newest first, filtered and paged.
export default async function AdminAuditPage({
  params,
  searchParams,
}: {
  params: Promise<{ locale: Locale }>;
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const { locale } = await params;
  setRequestLocale(locale);
  if (!(await requirePageSiteAdmin(locale, "/admin/audit"))) return null;
  const f = filters.parse(await searchParams);
  const to = f.to ? new Date(`${f.to}T00:00:00Z`) : undefined;
  if (to) to.setUTCDate(to.getUTCDate() + 1); // "to" includes its whole day (UTC)
  const [t, format, page] = await Promise.all([
    getTranslations("Admin"),
    getFormatter(),
    auditLog({
      source: f.source,
      actor: f.actor || undefined,
      from: f.from ? new Date(`${f.from}T00:00:00Z`) : undefined,
      to,
      page: f.page,
    }),
  ]);
  const query = (p: number) => ({
    ...(f.source ? { source: f.source } : {}),
    ...(f.actor ? { actor: f.actor } : {}),
    ...(f.from ? { from: f.from } : {}),
    ...(f.to ? { to: f.to } : {}),
    page: String(p),
  });
  return (
    <div className="space-y-4">
      <h1 className="text-3xl font-bold text-reed-900">{t("nav.audit")}</h1>
      <form method="get" aria-label={t("auditFilters")} className="flex flex-wrap items-end gap-3">
        <span>
          <label htmlFor="audit-source" className="block font-semibold">
            {t("auditSource")}
          </label>
          <select id="audit-source" name="source" defaultValue={f.source ?? ""} className={inputClass}>
            <option value="">{t("auditAll")}</option>
            {AUDIT_SOURCES.map((s) => (
              <option key={s} value={s}>
                {t(`sources.${s}`)}
              </option>
            ))}
          </select>
        </span>
        <span>
          <label htmlFor="audit-actor" className="block font-semibold">
            {t("auditActor")}
          </label>
          <input id="audit-actor" name="actor" defaultValue={f.actor ?? ""} className={`${inputClass} w-56`} />
        </span>
        <span>
          <label htmlFor="audit-from" className="block font-semibold">
            {t("auditFrom")}
          </label>
          <input id="audit-from" name="from" type="date" defaultValue={f.from ?? ""} className={inputClass} />
        </span>
        <span>
          <label htmlFor="audit-to" className="block font-semibold">
            {t("auditTo")}
          </label>
          <input id="audit-to" name="to" type="date" defaultValue={f.to ?? ""} className={inputClass} />
        </span>
        <button type="submit" className={buttonClass}>
          {t("auditApply")}
        </button>
      </form>
      {page.rows.length === 0 ? (
        <p>{t("auditEmpty")}</p>
      ) : (
        <table className="w-full text-left text-sm">
          <caption className="sr-only">{t("nav.audit")}</caption>
          <thead>
            <tr className="border-b border-reed-300">
              <th scope="col">{t("col.when")}</th>
              <th scope="col">{t("auditSource")}</th>
              <th scope="col">{t("auditActor")}</th>
              <th scope="col">{t("col.action")}</th>
              <th scope="col">{t("col.subject")}</th>
              <th scope="col">{t("col.detail")}</th>
            </tr>
          </thead>
          <tbody>
            {page.rows.map((r) => (
              <tr key={`${r.source}-${r.id}`} className="border-b border-reed-100 align-top">
                <td className="py-1 tabular-nums">
                  {format.dateTime(new Date(r.at), { dateStyle: "short", timeStyle: "medium" })}
                </td>
                <td>{t(`sources.${r.source}`)}</td>
                <td>{r.actor ?? "—"}</td>
                <td>
                  {r.source === "admin" && (ADMIN_ACTIONS as readonly string[]).includes(r.action)
                    ? t(`adminActions.${r.action as AdminAction}`)
                    : r.action}
                </td>
                <td>{r.subject ?? "—"}</td>
                <td>{r.detail}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      <nav aria-label={t("auditPages")} className="flex gap-4">
        {f.page > 0 ? (
          <Link href={{ pathname: "/admin/audit", query: query(f.page - 1) }} className="underline">
            {t("newer")}
          </Link>
        ) : null}
        <span>{t("pageN", { n: f.page + 1 })}</span>
        {page.more ? (
          <Link href={{ pathname: "/admin/audit", query: query(f.page + 1) }} className="underline">
            {t("older")}
          </Link>
        ) : null}
      </nav>
    </div>
  );
}
