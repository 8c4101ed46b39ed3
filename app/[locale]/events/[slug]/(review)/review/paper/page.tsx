import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { getTranslations, setRequestLocale } from "next-intl/server";
import { reviewEventBySlug } from "@/db/queries/review";
import { Link } from "@/lib/i18n/navigation";
import type { Locale } from "@/lib/i18n/routing";
import { requirePageEventRole } from "@/server/auth/page";
import { PaperSheetPanel } from "./paper-sheet-panel";

export const dynamic = "force-dynamic";

type Props = { params: Promise<{ locale: Locale; slug: string }> };

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  const { locale } = await params;
  const t = await getTranslations({ locale, namespace: "PaperSheets" });
  return { title: t("title") };
}

// Paper data sheets (coordinators, organisers): the template, then transcribed sheets into the review desk.
export default async function PaperSheetsPage({ params }: Props) {
  const { locale, slug } = await params;
  setRequestLocale(locale);
  const event = await reviewEventBySlug(slug);
  if (!event) notFound();
  const permit = await requirePageEventRole(locale, event.id, "coordinator", `/events/${slug}/review/paper`);
  const [t, tDesk] = await Promise.all([getTranslations("PaperSheets"), getTranslations("ReviewDesk")]);
  if (!permit) {
    return (
      <p role="alert" className="rounded-lg border-2 border-signal bg-signal-soft p-4 font-semibold text-signal">
        {t("notAllowed")}
      </p>
    );
  }
  return (
    <div className="space-y-4">
      <header className="space-y-1">
        <h1 className="text-3xl font-bold text-reed-900">{t("title")}</h1>
        <p className="text-lg">{event.name}</p>
        <p className="max-w-prose">{t("intro")}</p>
        <p>
          <Link href={`/events/${slug}/review`} className="underline">
            {tDesk("openDesk")}
          </Link>
        </p>
      </header>
      <PaperSheetPanel eventId={event.id} locale={locale} timeZone={event.timeZone} />
    </div>
  );
}
