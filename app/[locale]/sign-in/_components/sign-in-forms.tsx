"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { signIn } from "next-auth/react";
import { useTranslations } from "next-intl";
import { useState } from "react";
import { useForm } from "react-hook-form";
import {
  emailLinkInput,
  passwordSignInInput,
  type EmailLinkInput,
  type PasswordSignInInput,
} from "@/lib/validation/sign-in";
import { buttonClass, Field, inputClass, secondaryButtonClass } from "@/components/ui/field";
import { useRouter } from "@/lib/i18n/navigation";

type ErrorKey = "wrongPassword" | "rateLimited" | "noAccount" | "linkInvalid" | "generic";

export function errorKeyFor(code: string | null | undefined): ErrorKey | null {
  if (!code) return null;
  if (code === "CredentialsSignin") return "wrongPassword";
  if (code === "RateLimited") return "rateLimited";
  if (code === "AccessDenied") return "noAccount";
  if (code === "Verification") return "linkInvalid";
  return "generic";
}

export function SignInForms({ callbackUrl, initialError }: { callbackUrl: string; initialError: string | null }) {
  const t = useTranslations("SignIn");
  const router = useRouter();
  const [problem, setProblem] = useState<ErrorKey | null>(errorKeyFor(initialError));
  const link = useForm<EmailLinkInput>({ resolver: zodResolver(emailLinkInput) });
  const password = useForm<PasswordSignInInput>({ resolver: zodResolver(passwordSignInInput) });

  const sendLink = link.handleSubmit(async ({ email }) => {
    setProblem(null);
    const res = await signIn("email", { email, callbackUrl, redirect: false });
    const key = errorKeyFor(res?.error);
    if (key) setProblem(key);
    else router.push("/sign-in/check-email");
  });

  const withPassword = password.handleSubmit(async ({ email, password: pw }) => {
    setProblem(null);
    const res = await signIn("password", { email, password: pw, callbackUrl, redirect: false });
    const key = errorKeyFor(res?.error);
    if (key) setProblem(key);
    else window.location.assign(callbackUrl);
  });

  return (
    <div className="space-y-6">
      {problem ? (
        <p role="alert" className="rounded-lg border-2 border-signal bg-signal-soft p-3 font-semibold text-ink">
          <span aria-hidden="true">✕ </span>
          {t(`errors.${problem}`)}
        </p>
      ) : null}
      <div className="grid gap-6 md:grid-cols-2">
        <form
          onSubmit={withPassword}
          noValidate
          className="space-y-4 rounded-xl border border-reed-200 bg-white/70 p-4"
          aria-labelledby="pw-title"
        >
          <h2 id="pw-title" className="text-xl font-bold text-reed-900">
            {t("passwordTitle")}
          </h2>
          <Field
            id="pw-email"
            label={t("emailLabel")}
            error={password.formState.errors.email && t("errors.emailInvalid")}
          >
            <input
              id="pw-email"
              type="email"
              autoComplete="email"
              className={inputClass}
              aria-invalid={Boolean(password.formState.errors.email)}
              {...password.register("email")}
            />
          </Field>
          <Field
            id="pw-password"
            label={t("passwordLabel")}
            error={password.formState.errors.password && t("errors.passwordRequired")}
          >
            <input
              id="pw-password"
              type="password"
              autoComplete="current-password"
              className={inputClass}
              aria-invalid={Boolean(password.formState.errors.password)}
              {...password.register("password")}
            />
          </Field>
          <button type="submit" className={buttonClass} disabled={password.formState.isSubmitting}>
            {password.formState.isSubmitting ? t("signingIn") : t("passwordSubmit")}
          </button>
        </form>
        <form
          onSubmit={sendLink}
          noValidate
          className="space-y-4 rounded-xl border border-reed-200 bg-white/70 p-4"
          aria-labelledby="link-title"
        >
          <h2 id="link-title" className="text-xl font-bold text-reed-900">
            {t("linkTitle")}
          </h2>
          <Field
            id="link-email"
            label={t("emailLabel")}
            error={link.formState.errors.email && t("errors.emailInvalid")}
          >
            <input
              id="link-email"
              type="email"
              autoComplete="email"
              className={inputClass}
              aria-invalid={Boolean(link.formState.errors.email)}
              {...link.register("email")}
            />
          </Field>
          <button type="submit" className={secondaryButtonClass} disabled={link.formState.isSubmitting}>
            {link.formState.isSubmitting ? t("sending") : t("linkSubmit")}
          </button>
        </form>
      </div>
    </div>
  );
}
