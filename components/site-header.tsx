import { getTranslations } from "next-intl/server";
import { Link } from "@/lib/i18n/navigation";
import { EcotoneMark } from "./ecotone-mark";
import { LocaleSwitcher } from "./locale-switcher";

export async function SiteHeader() {
  const t = await getTranslations("Common");
  return (
    <header className="border-b-4 border-heath-400 bg-reed-800 text-paper">
      <div className="mx-auto flex max-w-5xl items-center justify-between gap-3 px-4 py-2">
        <Link href="/" className="flex min-h-touch items-center gap-2 text-lg font-bold tracking-tight">
          <EcotoneMark />
          <span>{t("appName")}</span>
        </Link>
        <div className="[&_select]:border-paper [&_select]:bg-reed-800 [&_select]:text-paper">
          <LocaleSwitcher />
        </div>
      </div>
    </header>
  );
}
