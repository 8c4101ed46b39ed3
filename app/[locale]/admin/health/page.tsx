import { getFormatter, getTranslations, setRequestLocale } from "next-intl/server";
import { mailQueueState, photoStorageByOrganisation } from "@/db/queries/admin";
import { MAIL_STATUSES } from "@/lib/domain";
import type { Locale } from "@/lib/i18n/routing";
import { serviceHealth } from "@/server/admin/health";
import { requirePageSiteAdmin } from "@/server/auth/page";
import { AdminAction } from "../_components/admin-action";

export const dynamic = "force-dynamic";

// Health: the services the site depends on, the e-mail outbox, the mail worker's last round and
// the photo storage each organisation uses.
export default async function AdminHealthPage({ params }: { params: Promise<{ locale: Locale }> }) {
  const { locale } = await params;
  setRequestLocale(locale);
  if (!(await requirePageSiteAdmin(locale, "/admin/health"))) return null;
  const [t, format, health, mail, storage] = await Promise.all([
    getTranslations("Admin"),
    getFormatter(),
    serviceHealth(),
    mailQueueState(),
    photoStorageByOrganisation(),
  ]);
  // Decimal units (SI), the size a storage bill states.
  const size = (bytes: number) => {
    const [unit, div] = bytes >= 1e9 ? ["gigabyte", 1e9] : bytes >= 1e6 ? ["megabyte", 1e6] : ["kilobyte", 1e3];
    return format.number(bytes / (div as number), {
      style: "unit",
      unit: unit as string,
      unitDisplay: "short",
      maximumFractionDigits: 1,
    });
  };
  const when = (d: Date | string) => format.dateTime(new Date(d), { dateStyle: "medium", timeStyle: "medium" });
  const mark = (ok: boolean) => (ok ? `✓ ${t("reachable")}` : `✕ ${t("unreachable")}`);
  return (
    <div className="space-y-6">
      <h1 className="text-3xl font-bold text-reed-900">{t("nav.health")}</h1>
      <section aria-labelledby="services-title" className="space-y-2">
        <h2 id="services-title" className="text-2xl font-bold text-reed-900">
          {t("servicesTitle")}
        </h2>
        <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1">
          <dt className="font-semibold">{t("database")}</dt>
          <dd>
            {mark(health.database.ok)}
            {health.database.ok ? ` (${health.database.latencyMs} ms)` : ""}
          </dd>
          <dt className="font-semibold">{t("smtp")}</dt>
          <dd>
            {mark(health.smtp.ok)} ({health.smtp.host})
          </dd>
          <dt className="font-semibold">{t("storage")}</dt>
          <dd>
            {mark(health.storage.ok)} ({health.storage.bucket})
          </dd>
          <dt className="font-semibold">{t("tiles")}</dt>
          <dd>
            {mark(health.tiles.ok)} ({health.tiles.origin})
          </dd>
          <dt className="font-semibold">{t("worker")}</dt>
          <dd>
            {mail.worker
              ? t("workerRun", { when: when(mail.worker.lastRunAt), summary: mail.worker.summary || "—" })
              : t("workerNever")}
            {mail.worker?.lastError ? (
              <span className="block text-signal">{t("workerError", { error: mail.worker.lastError })}</span>
            ) : null}
          </dd>
        </dl>
      </section>
      <section aria-labelledby="outbox-title" className="space-y-2">
        <h2 id="outbox-title" className="text-2xl font-bold text-reed-900">
          {t("outboxTitle")}
        </h2>
        <p>{MAIL_STATUSES.map((s) => t(`mailCount.${s}`, { n: mail.counts[s] ?? 0 })).join(" · ")}</p>
        {mail.troubled.length === 0 ? (
          <p>{t("outboxFine")}</p>
        ) : (
          <table className="w-full text-left text-sm">
            <caption className="sr-only">{t("troubledCaption")}</caption>
            <thead>
              <tr className="border-b border-reed-300">
                <th scope="col">{t("col.mail")}</th>
                <th scope="col">{t("col.status")}</th>
                <th scope="col">{t("col.why")}</th>
                <th scope="col">{t("col.actions")}</th>
              </tr>
            </thead>
            <tbody>
              {mail.troubled.map((m) => (
                <tr key={m.id} className="border-b border-reed-100 align-top">
                  <th scope="row" className="py-2 font-normal">
                    #{m.id} {m.kind} → {m.toAddress}
                    <span className="block text-ink-soft">{m.subject}</span>
                  </th>
                  <td>
                    {m.stuck ? t("stuck") : t(`mailStatus.${m.status as (typeof MAIL_STATUSES)[number]}`)} ·{" "}
                    {t("attempts", { n: m.attempts })}
                  </td>
                  <td className="whitespace-pre-line">{m.lastError ?? "—"}</td>
                  <td className="py-2">
                    <AdminAction url={`/api/admin/mails/${m.id}`} body={{}} label={t("retry")} />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </section>
      <section aria-labelledby="photo-storage-title" className="space-y-2">
        <h2 id="photo-storage-title" className="text-2xl font-bold text-reed-900">
          {t("photoStorageTitle")}
        </h2>
        <table className="w-full text-left text-sm">
          <caption className="sr-only">{t("photoStorageTitle")}</caption>
          <thead>
            <tr className="border-b border-reed-300">
              <th scope="col">{t("col.organisation")}</th>
              <th scope="col">{t("col.photos")}</th>
              <th scope="col">{t("col.storage")}</th>
            </tr>
          </thead>
          <tbody>
            {storage.map((o) => (
              <tr key={o.id} className="border-b border-reed-100">
                <th scope="row" className="py-2 font-normal">
                  {o.name}
                </th>
                <td>{format.number(o.photos)}</td>
                <td>{size(o.bytes)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </section>
    </div>
  );
}
