"use client";

import { signOut } from "next-auth/react";
import { useLocale, useTranslations } from "next-intl";

export function SignOutButton() {
  const t = useTranslations("SignIn");
  const locale = useLocale();
  return (
    <button
      type="button"
      onClick={() => signOut({ callbackUrl: `/${locale}` })}
      className="min-h-touch rounded-md px-2 font-semibold underline-offset-4 hover:underline"
    >
      {t("signOut")}
    </button>
  );
}
