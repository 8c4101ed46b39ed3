import { getTranslations } from "next-intl/server";

const points = ["weather", "water", "ground", "lone", "ticks", "wildlife", "paths"] as const;

// Field safety, shown on every event page (design.md, "Cautions the product shows").
export async function SafetyNotice() {
  const t = await getTranslations("Safety");
  return (
    <section aria-labelledby="safety-title" className="rounded-lg border-2 border-heath-500 bg-heath-50 p-4">
      <h2 id="safety-title" className="flex items-center gap-2 text-lg font-bold text-heath-900">
        <svg viewBox="0 0 24 24" className="h-6 w-6 shrink-0" aria-hidden="true">
          <path d="M12 2 1 21h22L12 2Z" fill="#8f5a12" />
          <path d="M11 9h2v6h-2zm0 8h2v2h-2z" fill="#fbf4e6" />
        </svg>
        {t("title")}
      </h2>
      <p className="mt-1 text-ink-soft">{t("intro")}</p>
      <ul className="mt-3 list-disc space-y-1 ps-5 text-ink">
        {points.map((p) => (
          <li key={p}>{t(p)}</li>
        ))}
      </ul>
    </section>
  );
}
