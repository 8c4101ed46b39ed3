"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useTranslations } from "next-intl";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { setPasswordInput, type SetPasswordInput } from "@/app/api/account/password/schema";
import { buttonClass, Field, inputClass } from "@/components/ui/field";
import { api, ApiClientError } from "@/lib/http/client";

type RuleKey = "tooShort" | "tooLong" | "sameAsEmail" | "tooCommon";

export function PasswordForm({ hasPassword }: { hasPassword: boolean }) {
  const t = useTranslations("Account");
  const tSetup = useTranslations("Setup");
  const [saved, setSaved] = useState(false);
  const form = useForm<SetPasswordInput>({ resolver: zodResolver(setPasswordInput) });
  const error = form.formState.errors.password;
  const currentError = form.formState.errors.currentPassword;

  const submit = form.handleSubmit(async (values) => {
    setSaved(false);
    try {
      await api.send("/api/account/password", "PUT", values);
    } catch (err) {
      if (!(err instanceof ApiClientError)) throw err;
      const first = err.fields[0];
      form.setError(first?.field === "currentPassword" ? "currentPassword" : "password", {
        message: err.problem || tSetup("genericError"),
      });
      return;
    }
    setSaved(true);
    form.reset();
  });

  // Client-side problems carry a rule key; the server's come already translated.
  const message =
    error?.message && ["tooShort", "tooLong", "sameAsEmail", "tooCommon"].includes(error.message)
      ? t(`passwordRules.${error.message as RuleKey}`)
      : error?.message;

  return (
    <form onSubmit={submit} noValidate className="max-w-md space-y-3">
      {hasPassword ? (
        <Field id="current-password" label={t("currentPassword")} error={currentError?.message}>
          <input
            id="current-password"
            type="password"
            autoComplete="current-password"
            className={inputClass}
            aria-invalid={Boolean(currentError)}
            {...form.register("currentPassword")}
          />
        </Field>
      ) : null}
      <Field id="new-password" label={t("newPassword")} hint={t("passwordHint")} error={message}>
        <input
          id="new-password"
          type="password"
          autoComplete="new-password"
          className={inputClass}
          aria-invalid={Boolean(error)}
          aria-describedby="new-password-hint"
          {...form.register("password")}
        />
      </Field>
      <button type="submit" className={buttonClass} disabled={form.formState.isSubmitting}>
        {t("save")}
      </button>
      {saved ? (
        <p role="status" className="font-semibold text-reed-700">
          ✓ {hasPassword ? t("savedOthersEnded") : t("saved")}
        </p>
      ) : null}
    </form>
  );
}
