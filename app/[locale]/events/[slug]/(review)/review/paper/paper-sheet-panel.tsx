"use client";

import { useTranslations } from "next-intl";
import { UploadPanel, type UploadAnswer } from "../../../(setup)/setup/_components/upload-panel";

type Summary = { sessions: number; sightings: number; fullLists: number };

// The template to download, then the upload panel of the setup screens for the transcribed sheet.
export function PaperSheetPanel({ eventId, locale, timeZone }: { eventId: string; locale: string; timeZone: string }) {
  const t = useTranslations("PaperSheets");
  const url = `/api/events/${eventId}/paper-sheets`;
  return (
    <div className="space-y-6">
      <section
        aria-labelledby="paper-template-title"
        className="space-y-2 rounded-xl border border-reed-200 bg-white/70 p-4"
      >
        <h2 id="paper-template-title" className="text-2xl font-bold text-reed-900">
          {t("templateTitle")}
        </h2>
        <p className="max-w-prose">{t("templateIntro")}</p>
        <a href={`${url}?locale=${locale}`} download className="font-semibold underline">
          {t("templateLink")}
        </a>
      </section>
      <UploadPanel<string, Summary, UploadAnswer<Summary>>
        kind="paper"
        url={url}
        accept=".csv,text/csv"
        read={(csv) => ({ content: csv })}
        body={(csv, save) => ({ csv, save })}
        onSaved={() => undefined}
        format={
          <ul className="ml-5 list-disc space-y-1 pt-2">
            <li>{t("format.lineType")}</li>
            <li>{t("format.session")}</li>
            <li>{t("format.sighting")}</li>
            <li>{t("format.times", { zone: timeZone })}</li>
            <li>{t("format.observer")}</li>
          </ul>
        }
      />
    </div>
  );
}
