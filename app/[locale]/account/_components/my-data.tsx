"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { signOut } from "next-auth/react";
import { useTranslations } from "next-intl";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { publishedNameInput, type PublishedNameInput } from "@/lib/account/published-name";
import { PublishedNameFields } from "@/components/published-name-fields";
import { buttonClass, Field, inputClass, secondaryButtonClass } from "@/components/ui/field";
import { clearDevice } from "@/lib/field/device-clear";
import { api, ApiClientError } from "@/lib/http/client";

/** The name published with the person's approved sightings, with consent given again on each change. */
export function PublishedNameForm({ current }: { current: string | null }) {
  const t = useTranslations("MyData");
  const [saved, setSaved] = useState(false);
  const form = useForm<PublishedNameInput>({
    resolver: zodResolver(publishedNameInput),
    defaultValues: { publishedName: current ?? "" },
  });
  const { errors, isSubmitting } = form.formState;
  const submit = form.handleSubmit(async (values) => {
    setSaved(false);
    try {
      await api.send("/api/account/published-name", "PUT", values);
      setSaved(true);
    } catch (err) {
      if (!(err instanceof ApiClientError)) throw err;
      form.setError("publishedName", { message: err.fields[0]?.message ?? err.problem });
    }
  });
  return (
    <form onSubmit={submit} noValidate className="max-w-md space-y-3">
      <PublishedNameFields
        idPrefix=""
        name={form.register("publishedName")}
        consent={form.register("consent")}
        nameError={errors.publishedName?.message}
        consentError={errors.consent?.message}
      />
      <button type="submit" className={buttonClass} disabled={isSubmitting}>
        {t("savePublished")}
      </button>
      {saved ? (
        <p role="status" className="font-semibold">
          ✓ {t("publishedSaved")}
        </p>
      ) : null}
    </form>
  );
}

/** Erasing the account: the person types their e-mail address; then this phone's field store is emptied too. */
export function DeleteAccountForm({ email }: { email: string }) {
  const t = useTranslations("MyData");
  const [confirm, setConfirm] = useState("");
  const [problem, setProblem] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const [done, setDone] = useState(false);
  const matches = confirm.trim().toLowerCase() === email.toLowerCase();

  const submit = async (e: React.FormEvent) => {
    e.preventDefault();
    if (!matches) {
      setProblem(t("errors.confirmMismatch"));
      return;
    }
    setBusy(true);
    setProblem(null);
    try {
      await api.send("/api/account", "DELETE", { confirm });
    } catch (err) {
      setBusy(false);
      if (!(err instanceof ApiClientError)) throw err;
      setProblem(err.fields[0]?.message ?? err.problem);
      return;
    }
    await clearDevice().catch(() => undefined);
    await signOut({ redirect: false }).catch(() => undefined);
    setDone(true);
  };

  if (done)
    return (
      <p role="status" className="rounded-lg border-2 border-reed-600 bg-reed-50 p-3 font-semibold">
        ✓ {t("deleted")}
      </p>
    );
  return (
    <form onSubmit={submit} noValidate className="max-w-md space-y-3">
      <p>{t("deleteBody")}</p>
      <Field id="delete-confirm" label={t("deleteConfirm", { email })} error={problem ?? undefined}>
        <input
          id="delete-confirm"
          type="email"
          autoComplete="off"
          className={inputClass}
          value={confirm}
          aria-invalid={Boolean(problem)}
          onChange={(e) => setConfirm(e.target.value)}
        />
      </Field>
      <button type="submit" className={`${secondaryButtonClass} border-signal text-signal`} disabled={busy}>
        {busy ? t("deleting") : t("deleteButton")}
      </button>
    </form>
  );
}
