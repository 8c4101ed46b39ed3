"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useTranslations } from "next-intl";
import { useState } from "react";
import { useForm, type UseFormRegister } from "react-hook-form";
import { createEventInput, type CreateEventInput } from "@/app/api/organisations/[organisationId]/events/schema";
import { buttonClass, Field, inputClass } from "@/components/ui/field";
import { useRouter } from "@/lib/i18n/navigation";
import { applyServerErrors, EventFields, useErrorText } from "@/components/setup/event-fields";
import { api, ApiClientError } from "@/lib/http/client";

const FIELDS = [
  "name",
  "slug",
  "description",
  "startsLocal",
  "endsLocal",
  "timeZone",
  "languages",
  "sessionKinds",
  "accuracyLimitM",
];

/** A URL-safe slug from a name: "Autumn Count 2026" → "autumn-count-2026". */
export function slugify(name: string): string {
  return name
    .normalize("NFKD")
    .replace(/[\u0300-\u036f]/g, "")
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, "-")
    .replace(/^-+|-+$/g, "")
    .slice(0, 80);
}

export function CreateEventForm({
  organisations,
  locale,
}: {
  organisations: { id: string; name: string }[];
  locale: string;
}) {
  const t = useTranslations("Setup");
  const text = useErrorText();
  const router = useRouter();
  const [organisationId, setOrganisationId] = useState(organisations[0]?.id ?? "");
  const [problem, setProblem] = useState<string | null>(null);
  const form = useForm<CreateEventInput>({
    resolver: zodResolver(createEventInput),
    defaultValues: {
      name: "",
      slug: "",
      description: "",
      startsLocal: "",
      endsLocal: "",
      timeZone: Intl.DateTimeFormat().resolvedOptions().timeZone,
      languages: [locale as CreateEventInput["languages"][number]],
      sessionKinds: ["timed_count", "walk", "plot_search"],
      photoRequiredSensitive: true,
      photoRequiredOffList: true,
      accuracyLimitM: 100,
    },
  });
  const { errors, isSubmitting } = form.formState;

  const submit = form.handleSubmit(async (values) => {
    setProblem(null);
    try {
      const made = await api.send<{ id: string; slug: string }>(
        `/api/organisations/${organisationId}/events`,
        "POST",
        values,
      );
      router.push(`/events/${made.slug}/setup`);
    } catch (err) {
      if (!(err instanceof ApiClientError)) throw err;
      if (!applyServerErrors(form.setError as never, err.fields, FIELDS)) setProblem(err.message || t("genericError"));
    }
  });

  return (
    <form
      onSubmit={submit}
      noValidate
      aria-labelledby="new-event-title"
      className="space-y-4 rounded-xl border border-reed-200 bg-white/70 p-4"
    >
      <h2 id="new-event-title" className="text-2xl font-bold text-reed-900">
        {t("newEvent")}
      </h2>
      {organisations.length > 1 ? (
        <Field id="event-org" label={t("event.organisation")}>
          <select
            id="event-org"
            className={inputClass}
            value={organisationId}
            onChange={(e) => setOrganisationId(e.target.value)}
          >
            {organisations.map((o) => (
              <option key={o.id} value={o.id}>
                {o.name}
              </option>
            ))}
          </select>
        </Field>
      ) : (
        <p>{t("event.organisationIs", { name: organisations[0]?.name ?? "" })}</p>
      )}
      <EventFields
        register={form.register as unknown as UseFormRegister<Omit<CreateEventInput, "slug">>}
        errors={errors}
      />
      <Field id="event-slug" label={t("event.slug")} hint={t("event.slugHint")} error={text(errors.slug?.message)}>
        <input
          id="event-slug"
          className={inputClass}
          aria-invalid={Boolean(errors.slug)}
          aria-describedby="event-slug-hint"
          {...form.register("slug")}
          onFocus={() => {
            if (!form.getValues("slug")) form.setValue("slug", slugify(form.getValues("name")));
          }}
        />
      </Field>
      {problem ? (
        <p role="alert" className="font-semibold text-signal">
          ✕ {problem}
        </p>
      ) : null}
      <button
        type="submit"
        className={buttonClass}
        disabled={isSubmitting || !organisationId}
        onClick={() => {
          if (!form.getValues("slug")) form.setValue("slug", slugify(form.getValues("name")));
        }}
      >
        {isSubmitting ? t("saving") : t("createEvent")}
      </button>
    </form>
  );
}
