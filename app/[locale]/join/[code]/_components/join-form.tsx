"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useTranslations } from "next-intl";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { joinInput, type JoinInput } from "@/app/api/join/schema";
import { PublishedNameFields } from "@/components/published-name-fields";
import { buttonClass, Field, inputClass } from "@/components/ui/field";
import { api, ApiClientError } from "@/lib/http/client";
import { Link } from "@/lib/i18n/navigation";

type Outcome = "joined" | "alreadyMember" | "mailed";

export function JoinForm({
  code,
  locale,
  signedInAs,
  eventSlug,
  publishedName,
}: {
  code: string;
  locale: string;
  signedInAs: string | null;
  eventSlug: string;
  publishedName: string | null;
}) {
  const t = useTranslations("Join");
  const tErr = useTranslations("Setup.errors");
  const tSetup = useTranslations("Setup");
  const tMy = useTranslations("MyData");
  const [outcome, setOutcome] = useState<Outcome | null>(null);
  const [problem, setProblem] = useState<string | null>(null);
  const form = useForm<JoinInput>({
    resolver: zodResolver(joinInput),
    defaultValues: {
      code,
      locale: locale as JoinInput["locale"],
      publishedName: publishedName ?? "",
      ...(signedInAs ? {} : { email: "" }),
    },
  });
  const { errors, isSubmitting } = form.formState;
  const submit = form.handleSubmit(async (values) => {
    setProblem(null);
    try {
      setOutcome((await api.send<{ outcome: Outcome }>("/api/join", "POST", values)).outcome);
    } catch (err) {
      if (!(err instanceof ApiClientError)) throw err;
      const field = err.fields[0];
      if (field?.field === "email") form.setError("email", { message: field.message });
      else if (field?.field === "publishedName") form.setError("publishedName", { message: field.message });
      else setProblem(err.problem || tSetup("genericError"));
    }
  });

  if (outcome === "mailed")
    return (
      <p role="status" className="rounded-lg border-2 border-reed-600 bg-reed-50 p-3 font-semibold">
        ✓ {t("mailed")}
      </p>
    );
  if (outcome) {
    return (
      <div role="status" className="space-y-2 rounded-lg border-2 border-reed-600 bg-reed-50 p-3">
        <p className="font-semibold">✓ {outcome === "joined" ? t("joined") : t("alreadyMember")}</p>
        <Link href={`/events/${eventSlug}`} className="underline">
          {t("toEvent")}
        </Link>
      </div>
    );
  }
  const emailError = errors.email?.message;
  return (
    <form
      onSubmit={submit}
      noValidate
      aria-labelledby="join-title"
      className="space-y-3 rounded-xl border border-reed-200 bg-white/70 p-4"
    >
      <h2 id="join-title" className="text-xl font-bold text-reed-900">
        {t("asVolunteer")}
      </h2>
      {signedInAs ? (
        <p>{t("signedInAs", { email: signedInAs })}</p>
      ) : (
        <>
          <p className="text-sm text-ink-soft">{t("intro")}</p>
          <Field
            id="join-email"
            label={t("email")}
            error={emailError ? (tErr.has(emailError as never) ? tErr(emailError as never) : emailError) : undefined}
          >
            <input
              id="join-email"
              type="email"
              autoComplete="email"
              className={inputClass}
              aria-invalid={Boolean(emailError)}
              {...form.register("email")}
            />
          </Field>
        </>
      )}
      <section aria-labelledby="join-publish-title" className="space-y-2 rounded-lg border border-reed-200 p-3">
        <h3 id="join-publish-title" className="font-bold text-reed-900">
          {tMy("publishTitle")}
        </h3>
        <PublishedNameFields
          idPrefix="join-"
          name={form.register("publishedName")}
          consent={form.register("consent")}
          nameError={errors.publishedName?.message}
          consentError={errors.consent?.message}
        />
      </section>
      {problem ? (
        <p role="alert" className="font-semibold text-signal">
          ✕ {problem}
        </p>
      ) : null}
      <button type="submit" className={buttonClass} disabled={isSubmitting}>
        {t("submit")}
      </button>
    </form>
  );
}
