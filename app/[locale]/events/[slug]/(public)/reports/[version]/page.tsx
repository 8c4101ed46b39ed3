import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { getTranslations, setRequestLocale } from "next-intl/server";
import { getPublicEventBySlug } from "@/db/queries/events";
import { getReport } from "@/db/queries/reports";
import { ReportView } from "@/components/results/report-view";
import type { Locale } from "@/lib/i18n/routing";

// Public by design: anyone may read a published report, without signing in.
export const dynamic = "force-dynamic";

type Props = {
  params: Promise<{ locale: Locale; slug: string; version: string }>;
  searchParams?: Promise<Record<string, string | string[] | undefined>>;
};

async function load(slug: string, version: string) {
  const v = Number(version);
  if (!Number.isInteger(v) || v < 1 || v > 1_000_000) return null;
  const event = await getPublicEventBySlug(slug);
  if (!event) return null;
  const report = await getReport(event.id, v, { withInputs: true });
  return report ? { event, report } : null;
}

export async function generateMetadata({ params }: Props): Promise<Metadata> {
  const { slug, version } = await params;
  const found = await load(slug, version);
  const t = await getTranslations("Report");
  return found ? { title: t("title", { event: found.event.name, version: found.report.version }) } : {};
}

export default async function ReportPage({ params, searchParams }: Props) {
  const { locale, slug, version } = await params;
  // The re-computation check reads every input record: run it when asked, not on every view.
  const wantCheck = (await searchParams)?.check === "1";
  setRequestLocale(locale);
  const found = await load(slug, version);
  if (!found) notFound();
  const { event, report } = found;
  return <ReportView event={event} report={report} locale={locale} wantCheck={wantCheck} />;
}
