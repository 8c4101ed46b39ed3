"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useTranslations } from "next-intl";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { buttonClass, Field, inputClass } from "@/components/ui/field";
import { api, ApiClientError } from "@/lib/http/client";
import { useRouter } from "@/lib/i18n/navigation";
import { organisationRequestInput, type OrganisationRequestFormInput } from "@/lib/organisations/request";

const FIELDS = ["name", "contactEmail", "country", "description"] as const;

export function RequestForm({
  countries,
  defaultEmail,
}: {
  countries: { code: string; name: string }[];
  defaultEmail: string;
}) {
  const t = useTranslations("Organisations");
  const router = useRouter();
  const [sent, setSent] = useState(false);
  const [problem, setProblem] = useState<string | null>(null);
  const form = useForm<OrganisationRequestFormInput>({
    resolver: zodResolver(organisationRequestInput),
    defaultValues: { name: "", contactEmail: defaultEmail, country: "", description: "" },
  });
  const { errors, isSubmitting } = form.formState;
  const error = (key: string | undefined) =>
    key ? (t.has(`errors.${key}` as never) ? t(`errors.${key}` as never) : key) : undefined;

  const submit = form.handleSubmit(async (values) => {
    setProblem(null);
    setSent(false);
    try {
      await api.send("/api/organisation-requests", "POST", values);
      setSent(true);
      form.reset({ name: "", contactEmail: defaultEmail, country: "", description: "" });
      router.refresh();
    } catch (err) {
      if (!(err instanceof ApiClientError)) throw err;
      let shown = false;
      for (const f of err.fields) {
        if ((FIELDS as readonly string[]).includes(f.field)) {
          form.setError(f.field as (typeof FIELDS)[number], { message: f.message });
          shown = true;
        }
      }
      if (!shown) setProblem(err.message || t("errors.failed"));
    }
  });

  return (
    <form onSubmit={submit} noValidate aria-label={t("requestTitle")} className="max-w-prose space-y-4">
      <Field id="org-name" label={t("name")} error={error(errors.name?.message)}>
        <input id="org-name" className={inputClass} aria-invalid={!!errors.name} {...form.register("name")} />
      </Field>
      <Field id="org-contact" label={t("contactEmail")} error={error(errors.contactEmail?.message)}>
        <input
          id="org-contact"
          type="email"
          className={inputClass}
          aria-invalid={!!errors.contactEmail}
          {...form.register("contactEmail")}
        />
      </Field>
      <Field id="org-country" label={t("country")} error={error(errors.country?.message)}>
        <select id="org-country" className={inputClass} aria-invalid={!!errors.country} {...form.register("country")}>
          <option value="">{t("chooseCountry")}</option>
          {countries.map((c) => (
            <option key={c.code} value={c.code}>
              {c.name}
            </option>
          ))}
        </select>
      </Field>
      <Field id="org-description" label={t("description")} error={error(errors.description?.message)}>
        <textarea
          id="org-description"
          rows={3}
          className={`${inputClass} py-2`}
          aria-invalid={!!errors.description}
          {...form.register("description")}
        />
      </Field>
      {problem ? (
        <p role="alert" className="font-semibold text-signal">
          {problem}
        </p>
      ) : null}
      <button type="submit" className={buttonClass} disabled={isSubmitting}>
        {isSubmitting ? t("sending") : t("send")}
      </button>
      {sent ? (
        <p role="status" className="font-semibold text-reed-700">
          ✓ {t("sent")}
        </p>
      ) : null}
    </form>
  );
}
