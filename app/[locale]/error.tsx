"use client";

import { useTranslations } from "next-intl";

export default function ErrorPage({ reset }: { error: Error; reset: () => void }) {
  const t = useTranslations("Errors");
  return (
    <div role="alert" className="space-y-3 rounded-lg border-2 border-signal bg-signal-soft p-4">
      <h1 className="text-2xl font-bold">{t("title")}</h1>
      <p>{t("body")}</p>
      <button
        type="button"
        onClick={reset}
        className="min-h-touch rounded-lg bg-reed-700 px-4 font-semibold text-paper"
      >
        {t("retry")}
      </button>
    </div>
  );
}
