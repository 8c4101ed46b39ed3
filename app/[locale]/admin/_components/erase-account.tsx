"use client";

import { useTranslations } from "next-intl";
import { useId, useState } from "react";
import { Field, inputClass, secondaryButtonClass } from "@/components/ui/field";
import { api, ApiClientError } from "@/lib/http/client";
import { useRouter } from "@/lib/i18n/navigation";

// Erasing a person's account from the console (app/api/admin/people/[userId] DELETE): folded
// away, and only after typing the person's address and a reason, as the person would erase it.
export function EraseAccount({ userId, email }: { userId: string; email: string }) {
  const t = useTranslations("Admin");
  const router = useRouter();
  const id = useId();
  const [confirm, setConfirm] = useState("");
  const [reason, setReason] = useState("");
  const [problem, setProblem] = useState<{ field: string; message: string } | null>(null);
  const [busy, setBusy] = useState(false);

  async function submit(e: React.FormEvent) {
    e.preventDefault();
    setBusy(true);
    setProblem(null);
    try {
      await api.send(`/api/admin/people/${userId}`, "DELETE", { confirm, reason });
      router.refresh();
    } catch (err) {
      if (!(err instanceof ApiClientError)) throw err;
      const first = err.fields[0];
      setProblem({ field: first?.field ?? "", message: first?.message ?? (err.message || t("failed")) });
    } finally {
      setBusy(false);
    }
  }

  return (
    <details className="mt-1">
      <summary className="cursor-pointer font-semibold text-signal">{t("erase")}</summary>
      <form onSubmit={submit} noValidate aria-label={t("eraseTitle", { email })} className="max-w-sm space-y-2 pt-2">
        <p className="text-sm">{t("eraseBody")}</p>
        <Field
          id={`${id}-confirm`}
          label={t("eraseConfirm", { email })}
          error={problem?.field === "confirm" ? problem.message : undefined}
        >
          <input
            id={`${id}-confirm`}
            type="email"
            autoComplete="off"
            className={inputClass}
            value={confirm}
            aria-invalid={problem?.field === "confirm"}
            onChange={(e) => setConfirm(e.target.value)}
          />
        </Field>
        <Field
          id={`${id}-reason`}
          label={t("eraseReason")}
          error={problem && problem.field !== "confirm" ? problem.message : undefined}
        >
          <input
            id={`${id}-reason`}
            className={inputClass}
            value={reason}
            aria-invalid={problem?.field === "reason"}
            onChange={(e) => setReason(e.target.value)}
          />
        </Field>
        <button type="submit" className={`${secondaryButtonClass} border-signal text-signal`} disabled={busy}>
          {t("eraseButton")}
        </button>
      </form>
    </details>
  );
}
