"use client";

import { useTranslations } from "next-intl";
import { useId, useState } from "react";
import { buttonClass, inputClass, secondaryButtonClass } from "@/components/ui/field";
import { api, ApiClientError } from "@/lib/http/client";
import { useRouter } from "@/lib/i18n/navigation";

// One admin action: a button that sends `body` (plus a typed reason when `reason` is set)
// to a handler, then reloads the page's data; a refusal is shown beside it.
export function AdminAction({
  url,
  method = "POST",
  body,
  label,
  reason,
  primary = false,
}: {
  url: string;
  method?: "POST" | "PATCH";
  body: Record<string, unknown>;
  label: string;
  /** The label of a reason field shown before the button can be used. */
  reason?: string;
  primary?: boolean;
}) {
  const t = useTranslations("Admin");
  const router = useRouter();
  const id = useId();
  const [text, setText] = useState("");
  const [problem, setProblem] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function run() {
    setBusy(true);
    setProblem(null);
    try {
      await api.send(url, method, reason === undefined ? body : { ...body, reason: text });
      setText("");
      router.refresh();
    } catch (err) {
      if (!(err instanceof ApiClientError)) throw err;
      setProblem(err.fields[0]?.message ?? (err.message || t("failed")));
    } finally {
      setBusy(false);
    }
  }

  return (
    <span className="inline-flex flex-wrap items-end gap-2">
      {reason !== undefined ? (
        <span className="inline-block">
          <label htmlFor={id} className="block text-sm font-semibold">
            {reason}
          </label>
          <input id={id} className={`${inputClass} w-56`} value={text} onChange={(e) => setText(e.target.value)} />
        </span>
      ) : null}
      <button type="button" className={primary ? buttonClass : secondaryButtonClass} disabled={busy} onClick={run}>
        {label}
      </button>
      {problem ? (
        <span role="alert" className="text-sm font-semibold text-signal">
          {problem}
        </span>
      ) : null}
    </span>
  );
}
