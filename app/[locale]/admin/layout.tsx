import type { ReactNode } from "react";
import { getTranslations, setRequestLocale } from "next-intl/server";
import { Link } from "@/lib/i18n/navigation";
import { ClientMessages } from "@/components/client-messages";
import type { Locale } from "@/lib/i18n/routing";
import { requirePageUser } from "@/server/auth/page";

export const dynamic = "force-dynamic";

// The site admin console: only people with the admin role see anything under it.
export default async function AdminLayout({
  children,
  params,
}: {
  children: ReactNode;
  params: Promise<{ locale: string }>;
}) {
  const { locale } = (await params) as { locale: Locale };
  setRequestLocale(locale);
  const user = await requirePageUser(locale, "/admin");
  const t = await getTranslations("Admin");
  if (!user.isAdmin)
    return (
      <p role="alert" className="rounded-lg border-2 border-signal bg-signal-soft p-4 font-semibold text-signal">
        {t("notAllowed")}
      </p>
    );
  const links = [
    ["/admin", t("nav.organisations")],
    ["/admin/people", t("nav.people")],
    ["/admin/events", t("nav.events")],
    ["/admin/health", t("nav.health")],
    ["/admin/audit", t("nav.audit")],
  ] as const;
  return (
    <div className="space-y-6">
      <nav aria-label={t("title")}>
        <p className="text-sm font-semibold text-ink-soft">{t("title")}</p>
        <ul className="flex flex-wrap gap-4">
          {links.map(([href, label]) => (
            <li key={href}>
              <Link href={href} className="font-semibold text-reed-800 underline">
                {label}
              </Link>
            </li>
          ))}
        </ul>
      </nav>
      <ClientMessages namespaces={["Admin"]}>{children}</ClientMessages>
    </div>
  );
}
