import { getFormatter, getTranslations, setRequestLocale } from "next-intl/server";
import { rolesOf } from "@/db/queries/auth";
import { requirePageUser } from "@/server/auth/page";
import { Link } from "@/lib/i18n/navigation";
import type { Locale } from "@/lib/i18n/routing";
import { PasswordForm } from "./_components/password-form";
import { DeleteAccountForm, PublishedNameForm } from "./_components/my-data";
import { publishedNameOf } from "@/db/queries/my-data";

export const dynamic = "force-dynamic";

export default async function AccountPage({ params }: { params: Promise<{ locale: Locale }> }) {
  const { locale } = await params;
  setRequestLocale(locale);
  const user = await requirePageUser(locale, "/account");
  const [t, tRole, tGroup, tDesk, tMy, format, roles, published] = await Promise.all([
    getTranslations("Account"),
    getTranslations("Role"),
    getTranslations("TaxonGroup"),
    getTranslations("ReviewDesk"),
    getTranslations("MyData"),
    getFormatter(),
    rolesOf(user.id),
    publishedNameOf(user.id),
  ]);
  type Group = Parameters<typeof tGroup>[0];
  return (
    <div className="space-y-8">
      <header>
        <h1 className="text-3xl font-bold text-reed-900">{t("title")}</h1>
        <p className="text-ink-soft">{t("details", { email: user.email })}</p>
      </header>
      <section aria-labelledby="roles-title" className="space-y-2">
        <h2 id="roles-title" className="text-2xl font-bold text-reed-900">
          {t("rolesTitle")}
        </h2>
        {roles.length === 0 ? (
          <p>{t("noRoles")}</p>
        ) : (
          <ul className="space-y-2">
            {roles.map((r) => (
              <li key={r.eventId} className="rounded-lg border border-reed-200 bg-white/70 p-3">
                <Link href={`/events/${r.eventSlug}`} className="font-semibold text-reed-800 underline">
                  {t("roleIn", { role: tRole(r.role), event: r.eventName })}
                </Link>
                {r.taxonGroups.length ? (
                  <span className="block text-sm text-ink-soft">
                    {t("groupsLimit", { groups: r.taxonGroups.map((g) => tGroup(g as Group)).join(", ") })}
                  </span>
                ) : null}
                {r.role !== "volunteer" ? (
                  <span className="flex flex-wrap gap-x-4">
                    <Link
                      href={`/events/${r.eventSlug}/review`}
                      className="mt-1 inline-flex min-h-touch items-center font-semibold text-reed-800 underline"
                    >
                      {tDesk("openDesk")}
                    </Link>
                    <Link
                      href={`/events/${r.eventSlug}/results`}
                      className="mt-1 inline-flex min-h-touch items-center font-semibold text-reed-800 underline"
                    >
                      {t("resultsLink")}
                    </Link>
                    {r.role === "organiser" ? (
                      <Link
                        href={`/events/${r.eventSlug}/setup`}
                        className="mt-1 inline-flex min-h-touch items-center font-semibold text-reed-800 underline"
                      >
                        {t("setupLink")}
                      </Link>
                    ) : null}
                  </span>
                ) : null}
              </li>
            ))}
          </ul>
        )}
      </section>
      <section aria-labelledby="password-title" className="space-y-2">
        <h2 id="password-title" className="text-2xl font-bold text-reed-900">
          {t("passwordTitle")}
        </h2>
        <p>{user.hasPassword ? t("passwordHasOne") : t("passwordNone")}</p>
        <PasswordForm hasPassword={user.hasPassword} />
      </section>
      <section aria-labelledby="published-title" className="space-y-2">
        <h2 id="published-title" className="text-2xl font-bold text-reed-900">
          {tMy("publishedTitle")}
        </h2>
        <p>
          {published.name && published.consentAt
            ? tMy("publishedCurrent", {
                name: published.name,
                date: format.dateTime(published.consentAt, { dateStyle: "long" }),
              })
            : tMy("publishedNone")}
        </p>
        <PublishedNameForm current={published.name} />
      </section>
      <section aria-labelledby="data-title" className="space-y-2">
        <h2 id="data-title" className="text-2xl font-bold text-reed-900">
          {tMy("dataTitle")}
        </h2>
        <p>{tMy("dataBody")}</p>
        <p className="flex flex-wrap gap-3">
          <a href="/api/account/data?format=json" download className="font-semibold text-reed-800 underline">
            {tMy("downloadJson")}
          </a>
          <a href="/api/account/data?format=csv" download className="font-semibold text-reed-800 underline">
            {tMy("downloadCsv")}
          </a>
        </p>
      </section>
      <section aria-labelledby="delete-title" className="space-y-2">
        <h2 id="delete-title" className="text-2xl font-bold text-reed-900">
          {tMy("deleteTitle")}
        </h2>
        <DeleteAccountForm email={user.email} />
      </section>
    </div>
  );
}
