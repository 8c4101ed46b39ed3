"use client";

import { useTranslations } from "next-intl";
import { useMemo } from "react";
import type { FieldErrors, UseFormRegister } from "react-hook-form";
import type { CreateEventInput } from "@/lib/setup/event";
import { Field, inputClass } from "@/components/ui/field";
import { locales } from "@/lib/i18n/routing";

type Values = Omit<CreateEventInput, "slug">;
type ErrorKey = Parameters<ReturnType<typeof useTranslations<"Setup.errors">>>[0];

/** A zod message is a key under Setup.errors on the client; the server's come translated. */
export function useErrorText() {
  const t = useTranslations("Setup.errors");
  return (message: string | undefined) => {
    if (!message) return undefined;
    return t.has(message as ErrorKey) ? t(message as ErrorKey) : message;
  };
}

const KINDS = ["timed_count", "walk", "plot_search"] as const;

// The fields every event has, shared by the "new event" and "event details" forms.
export function EventFields({ register, errors }: { register: UseFormRegister<Values>; errors: FieldErrors<Values> }) {
  const t = useTranslations("Setup.event");
  const tLang = useTranslations("LocaleSwitcher");
  const text = useErrorText();
  const zones = useMemo(
    () => (typeof Intl.supportedValuesOf === "function" ? Intl.supportedValuesOf("timeZone") : []),
    [],
  );
  const box = "flex min-h-touch items-center gap-2";
  return (
    <>
      <Field id="event-name" label={t("name")} error={text(errors.name?.message)}>
        <input id="event-name" className={inputClass} aria-invalid={Boolean(errors.name)} {...register("name")} />
      </Field>
      <Field id="event-description" label={t("description")} error={text(errors.description?.message)}>
        <textarea
          id="event-description"
          rows={3}
          className={`${inputClass} py-2`}
          aria-invalid={Boolean(errors.description)}
          {...register("description")}
        />
      </Field>
      <div className="grid gap-4 sm:grid-cols-3">
        <Field id="event-starts" label={t("starts")} error={text(errors.startsLocal?.message)}>
          <input
            id="event-starts"
            type="datetime-local"
            className={inputClass}
            aria-invalid={Boolean(errors.startsLocal)}
            {...register("startsLocal")}
          />
        </Field>
        <Field id="event-ends" label={t("ends")} error={text(errors.endsLocal?.message)}>
          <input
            id="event-ends"
            type="datetime-local"
            className={inputClass}
            aria-invalid={Boolean(errors.endsLocal)}
            {...register("endsLocal")}
          />
        </Field>
        <Field id="event-tz" label={t("timeZone")} hint={t("timeZoneHint")} error={text(errors.timeZone?.message)}>
          <input
            id="event-tz"
            list="event-tz-list"
            className={inputClass}
            aria-invalid={Boolean(errors.timeZone)}
            aria-describedby="event-tz-hint"
            {...register("timeZone")}
          />
          <datalist id="event-tz-list">
            {zones.map((z) => (
              <option key={z} value={z} />
            ))}
          </datalist>
        </Field>
      </div>
      <fieldset className="space-y-1">
        <legend className="font-semibold">{t("languages")}</legend>
        <p className="text-sm text-ink-soft">{t("languagesHint")}</p>
        <div className="flex flex-wrap gap-x-6">
          {locales.map((l) => (
            <label key={l} className={box}>
              <input type="checkbox" value={l} className="size-5" {...register("languages")} />
              {tLang(l)}
            </label>
          ))}
        </div>
        {errors.languages ? (
          <p role="alert" className="text-sm font-semibold text-signal">
            ✕ {text(errors.languages.message)}
          </p>
        ) : null}
      </fieldset>
      <fieldset className="space-y-1">
        <legend className="font-semibold">{t("sessionKinds")}</legend>
        <p className="text-sm text-ink-soft">{t("sessionKindsHint")}</p>
        <div className="flex flex-wrap gap-x-6">
          {KINDS.map((k) => (
            <label key={k} className={box}>
              <input type="checkbox" value={k} className="size-5" {...register("sessionKinds")} />
              {t(`kind.${k}`)}
            </label>
          ))}
        </div>
        {errors.sessionKinds ? (
          <p role="alert" className="text-sm font-semibold text-signal">
            ✕ {text(errors.sessionKinds.message)}
          </p>
        ) : null}
      </fieldset>
      <fieldset className="space-y-1">
        <legend className="font-semibold">{t("photoRules")}</legend>
        <label className={box}>
          <input type="checkbox" className="size-5" {...register("photoRequiredSensitive")} />
          {t("photoSensitive")}
        </label>
        <label className={box}>
          <input type="checkbox" className="size-5" {...register("photoRequiredOffList")} />
          {t("photoOffList")}
        </label>
      </fieldset>
      <Field
        id="event-accuracy"
        label={t("accuracy")}
        hint={t("accuracyHint")}
        error={text(errors.accuracyLimitM?.message)}
      >
        <input
          id="event-accuracy"
          type="number"
          inputMode="numeric"
          min={1}
          max={10000}
          className={`${inputClass} max-w-40`}
          aria-invalid={Boolean(errors.accuracyLimitM)}
          aria-describedby="event-accuracy-hint"
          {...register("accuracyLimitM", { valueAsNumber: true })}
        />
      </Field>
    </>
  );
}

/** Puts the server's field problems onto the form (their messages come translated). */
export function applyServerErrors(
  setError: (name: never, e: { message: string }) => void,
  fields: { field: string; message: string }[] | undefined,
  known: string[],
) {
  let placed = 0;
  for (const f of fields ?? []) {
    const name = f.field.split(".")[0]!;
    if (known.includes(name)) {
      setError(name as never, { message: f.message });
      placed++;
    }
  }
  return placed;
}
