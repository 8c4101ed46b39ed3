"use client";

import { useTranslations } from "next-intl";
import type { UseFormRegisterReturn } from "react-hook-form";
import { Field, inputClass } from "@/components/ui/field";

/** An error code of lib/account/published-name in the person's language (an unknown text is shown as it came). */
export function usePublishedNameErrorText() {
  const t = useTranslations("MyData");
  return (m: string | undefined) => (m ? (t.has(`errors.${m}` as never) ? t(`errors.${m}` as never) : m) : undefined);
}

/**
 * The name published with a person's approved sightings and the consent given with it: one
 * block for the account page and the join page, so both say the same thing the same way.
 */
export function PublishedNameFields({
  idPrefix,
  name,
  consent,
  nameError,
  consentError,
}: {
  idPrefix: string;
  name: UseFormRegisterReturn;
  consent: UseFormRegisterReturn;
  nameError?: string;
  consentError?: string;
}) {
  const t = useTranslations("MyData");
  const errorText = usePublishedNameErrorText();
  const consentErrorId = `${idPrefix}consent-error`;
  return (
    <>
      <p className="text-sm">{t("publishStatement")}</p>
      <Field id={`${idPrefix}published-name`} label={t("publishedName")} error={errorText(nameError)}>
        <input
          id={`${idPrefix}published-name`}
          autoComplete="nickname"
          maxLength={80}
          className={inputClass}
          aria-invalid={Boolean(nameError)}
          {...name}
        />
      </Field>
      <label className="flex min-h-touch items-start gap-2">
        <input
          type="checkbox"
          className="mt-1 size-5"
          aria-invalid={Boolean(consentError)}
          aria-describedby={consentError ? consentErrorId : undefined}
          {...consent}
        />
        <span>{t("consent")}</span>
      </label>
      {consentError ? (
        <p id={consentErrorId} role="alert" className="font-semibold text-signal">
          ✕ {errorText(consentError)}
        </p>
      ) : null}
    </>
  );
}
