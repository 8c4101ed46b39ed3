import { getTranslations } from "next-intl/server";
import { Link } from "@/lib/i18n/navigation";

export default async function NotFound() {
  const t = await getTranslations("NotFound");
  return (
    <div className="space-y-3">
      <h1 className="text-2xl font-bold text-reed-900">{t("title")}</h1>
      <p>{t("body")}</p>
      <Link href="/" className="inline-flex min-h-touch items-center font-semibold text-reed-700 underline">
        {t("back")}
      </Link>
    </div>
  );
}
