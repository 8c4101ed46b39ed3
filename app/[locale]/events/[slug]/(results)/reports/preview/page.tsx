import type { Metadata } from "next";
import { notFound } from "next/navigation";
import { getFormatter, getTranslations, setRequestLocale } from "next-intl/server";
import { getMemberEventBySlug } from "@/db/queries/events";
import { previewProblems } from "@/db/queries/reports";
import { ReportView } from "@/components/results/report-view";
import { requirePageEventRole } from "@/server/auth/page";
import { previewReport } from "@/server/results/publish";
import { canonicalJson, type Results } from "@/lib/results/compute";
import { METHOD_NOTES } from "@/lib/results/methods";
import { LocaleLink as Link } from "@/components/locale-link";
import type { Locale } from "@/lib/i18n/routing";
import { PreviewPublish } from "./preview-publish";

// The organiser's preview of the next report version (issue 16): the same component as the
// public page, computed as publishing would, marked "preview", never public and never indexed.
export const dynamic = "force-dynamic";

type Props = { params: Promise<{ locale: Locale; slug: string }> };

export async function generateMetadata(): Promise<Metadata> {
  const t = await getTranslations("Report");
  return { title: t("preview.title"), robots: { index: false, follow: false } };
}

export default async function ReportPreviewPage({ params }: Props) {
  const { locale, slug } = await params;
  setRequestLocale(locale);
  const event = await getMemberEventBySlug(slug);
  if (!event) notFound();
  const permit = await requirePageEventRole(locale, event.id, "organiser", `/events/${slug}/reports/preview`);
  const t = await getTranslations("Report");
  if (!permit) return <p role="alert">{t("preview.notAllowed")}</p>;
  const [draft, problems, format, tMarks, tStates] = await Promise.all([
    previewReport(event.id),
    previewProblems(event.id, locale),
    getFormatter(),
    getTranslations("ReviewDesk.marks"),
    getTranslations("ReviewDesk.states"),
  ]);
  const when = (d: Date) => format.dateTime(d, { dateStyle: "medium", timeStyle: "short", timeZone: event.timeZone });
  const line = (r: (typeof problems.open)[number]) =>
    t("preview.recordLine", {
      taxon: r.taxon ?? r.description,
      count: r.count,
      when: when(r.observedAt),
      volunteer: r.volunteer,
    });
  return (
    <div className="space-y-6">
      <section
        aria-labelledby="preview-title"
        className="space-y-3 rounded-lg border-4 border-dashed border-heath-500 bg-heath-50 p-4"
        data-testid="preview-banner"
      >
        <h1 id="preview-title" className="text-2xl font-bold text-heath-900">
          {t("preview.title")}
        </h1>
        <p>{t("preview.intro", { version: draft.version })}</p>
        {problems.openTotal > 0 ? (
          <div role="alert" className="space-y-1 rounded-lg border-2 border-signal bg-signal-soft p-3">
            <p className="font-semibold">
              {t("preview.openWarning", { pending: draft.pending.pending, returned: draft.pending.returned })}
            </p>
            <ul className="list-disc ps-5 text-sm">
              {problems.open.map((r) => (
                <li key={r.id}>
                  {tStates(r.state as "pending")}: {line(r)}
                </li>
              ))}
            </ul>
            {problems.openTotal > problems.open.length ? (
              <p className="text-sm">{t("preview.more", { n: problems.openTotal - problems.open.length })}</p>
            ) : null}
          </div>
        ) : (
          <p>{t("preview.noneOpen")}</p>
        )}
        {problems.markedTotal > 0 ? (
          <div className="space-y-1 rounded-lg border-2 border-heath-500 bg-white/70 p-3">
            <p className="font-semibold">{t("preview.markedWarning", { n: problems.markedTotal })}</p>
            <ul className="list-disc ps-5 text-sm">
              {problems.marked.map((r) => (
                <li key={r.id}>
                  {line(r)} — {r.marks.map((m) => tMarks(m as "high_count")).join(", ")}
                </li>
              ))}
            </ul>
            {problems.markedTotal > problems.marked.length ? (
              <p className="text-sm">{t("preview.more", { n: problems.markedTotal - problems.marked.length })}</p>
            ) : null}
          </div>
        ) : null}
        <p>
          <Link href={`/events/${slug}/review`} className="font-semibold underline">
            {t("preview.toDesk")}
          </Link>
        </p>
        <PreviewPublish
          eventId={event.id}
          slug={slug}
          locale={locale}
          version={draft.version}
          open={draft.pending.pending + draft.pending.returned}
          labels={{
            publish: t("preview.publish"),
            dialog: t("preview.confirmTitle", { version: draft.version }),
            confirmOpen: t("preview.confirmOpen", {
              pending: draft.pending.pending,
              returned: draft.pending.returned,
            }),
            note: t("preview.note"),
            noteHint: t("preview.noteHint"),
            notify: t("preview.notify"),
            confirm: t("preview.confirm"),
            cancel: t("preview.cancel"),
            busy: t("preview.publishing"),
          }}
        />
      </section>
      <ReportView
        preview
        locale={locale}
        event={event}
        report={{
          id: null,
          version: draft.version,
          latestVersion: draft.version,
          publishedAt: new Date(),
          engineVersion: draft.results.engineVersion,
          inputHash: draft.inputHash,
          inputCount: draft.records.length,
          inputRecords: draft.records,
          // As it will be stored: canonical JSON, read back.
          results: JSON.parse(canonicalJson(draft.results)) as Results,
          methodNotes: METHOD_NOTES,
          changes: draft.changes,
          note: "",
          withdrawal: null,
          besideEarlier: draft.besideEarlier,
        }}
      />
    </div>
  );
}
