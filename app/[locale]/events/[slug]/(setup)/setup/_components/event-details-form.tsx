"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useTranslations } from "next-intl";
import { useEffect, useState } from "react";
import { useForm, type UseFormRegister } from "react-hook-form";
import useSWR from "swr";
import type { CreateEventInput } from "@/app/api/organisations/[organisationId]/events/schema";
import { updateEventInput, type UpdateEventInput } from "@/app/api/events/[eventId]/setup/schema";
import { buttonClass, Field, inputClass } from "@/components/ui/field";
import { applyServerErrors, EventFields } from "@/components/setup/event-fields";
import { api, ApiClientError, fetcher } from "@/lib/http/client";
import { DATA_LICENSE_KEYS } from "@/lib/results/licenses";

type Details = UpdateEventInput & { slug: string; joinCode: string | null };
const FIELDS = [
  "name",
  "description",
  "startsLocal",
  "endsLocal",
  "timeZone",
  "languages",
  "sessionKinds",
  "accuracyLimitM",
  "status",
  "dataLicense",
  "publishAbsences",
];
const LICENSE_LABEL = { "cc0-1.0": "cc0", "cc-by-4.0": "ccBy", "cc-by-nc-4.0": "ccByNc" } as const;

export function EventDetailsForm({ eventId }: { eventId: string }) {
  const t = useTranslations("Setup");
  const tStatus = useTranslations("Home.status");
  const url = `/api/events/${eventId}/setup`;
  const { data, error, mutate } = useSWR<Details, ApiClientError>(url, fetcher);
  const [saved, setSaved] = useState(false);
  const [problem, setProblem] = useState<string | null>(null);
  const form = useForm<UpdateEventInput>({ resolver: zodResolver(updateEventInput) });
  const { errors, isSubmitting } = form.formState;

  useEffect(() => {
    if (!data) return;
    form.reset({
      name: data.name,
      description: data.description,
      startsLocal: data.startsLocal,
      endsLocal: data.endsLocal,
      timeZone: data.timeZone,
      languages: data.languages,
      sessionKinds: data.sessionKinds,
      photoRequiredSensitive: data.photoRequiredSensitive,
      photoRequiredOffList: data.photoRequiredOffList,
      accuracyLimitM: data.accuracyLimitM,
      status: data.status,
      dataLicense: data.dataLicense,
      publishAbsences: data.publishAbsences,
    });
  }, [data, form]);

  const submit = form.handleSubmit(async (values) => {
    setSaved(false);
    setProblem(null);
    try {
      await api.send(url, "PATCH", values);
    } catch (err) {
      if (!(err instanceof ApiClientError)) throw err;
      if (!applyServerErrors(form.setError as never, err.fields, FIELDS)) setProblem(err.message || t("genericError"));
      return;
    }
    setSaved(true);
    await mutate();
  });

  if (error)
    return (
      <p role="alert" className="font-semibold text-signal">
        ✕ {error.message || t("genericError")}
      </p>
    );
  if (!data) return <p role="status">{t("loading")}</p>;
  return (
    <form onSubmit={submit} noValidate aria-labelledby="details-title" className="space-y-4">
      <h2 id="details-title" className="text-2xl font-bold text-reed-900">
        {t("tabs.details")}
      </h2>
      <p className="text-sm text-ink-soft">{t("event.slugFixed", { slug: data.slug })}</p>
      <EventFields
        register={form.register as unknown as UseFormRegister<Omit<CreateEventInput, "slug">>}
        errors={errors}
      />
      <Field id="event-status" label={t("event.status")} hint={t("event.statusHint")}>
        <select
          id="event-status"
          className={`${inputClass} max-w-xs`}
          aria-describedby="event-status-hint"
          {...form.register("status")}
        >
          {(["draft", "open", "closed"] as const).map((s) => (
            <option key={s} value={s}>
              {tStatus(s)}
            </option>
          ))}
        </select>
      </Field>
      <Field id="event-license" label={t("event.dataLicense")} hint={t("event.dataLicenseHint")}>
        <select
          id="event-license"
          className={`${inputClass} max-w-md`}
          aria-describedby="event-license-hint"
          {...form.register("dataLicense")}
        >
          {DATA_LICENSE_KEYS.map((k) => (
            <option key={k} value={k}>
              {t(`event.license.${LICENSE_LABEL[k]}`)}
            </option>
          ))}
        </select>
      </Field>
      <div className="space-y-1">
        <label className="flex min-h-touch items-center gap-2 font-semibold">
          <input type="checkbox" aria-describedby="event-absences-hint" {...form.register("publishAbsences")} />
          {t("event.publishAbsences")}
        </label>
        <p id="event-absences-hint" className="text-sm text-ink-soft">
          {t("event.publishAbsencesHint")}
        </p>
      </div>
      {problem ? (
        <p role="alert" className="font-semibold text-signal">
          ✕ {problem}
        </p>
      ) : null}
      <button type="submit" className={buttonClass} disabled={isSubmitting}>
        {isSubmitting ? t("saving") : t("saveDetails")}
      </button>
      {saved ? (
        <p role="status" className="font-semibold text-reed-700">
          ✓ {t("savedDetails")}
        </p>
      ) : null}
    </form>
  );
}
