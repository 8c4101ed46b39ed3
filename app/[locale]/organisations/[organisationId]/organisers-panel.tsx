"use client";

import { useFormatter, useTranslations } from "next-intl";
import { useState } from "react";
import useSWR from "swr";
import { buttonClass, Field, inputClass, secondaryButtonClass } from "@/components/ui/field";
import { api, ApiClientError, fetcher } from "@/lib/http/client";

type Data = {
  organisers: { userId: string; email: string; name: string | null; since: string }[];
  log: {
    id: number;
    action: string;
    actorEmail: string | null;
    subjectEmail: string | null;
    reason: string;
    at: string;
  }[];
};

export function OrganisersPanel({ organisationId, selfId }: { organisationId: string; selfId: string }) {
  const t = useTranslations("Organisations");
  const format = useFormatter();
  const url = `/api/organisations/${organisationId}/organisers`;
  const { data, mutate } = useSWR<Data>(url, fetcher);
  const [email, setEmail] = useState("");
  const [problem, setProblem] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function run(action: () => Promise<unknown>) {
    setProblem(null);
    setBusy(true);
    try {
      await action();
      await mutate();
      return true;
    } catch (err) {
      if (!(err instanceof ApiClientError)) throw err;
      setProblem(err.fields[0]?.message ?? (err.message || t("errors.failed")));
      return false;
    } finally {
      setBusy(false);
    }
  }

  return (
    <div className="space-y-6">
      <section aria-labelledby="organisers-title" className="space-y-2">
        <h2 id="organisers-title" className="sr-only">
          {t("organisersLink")}
        </h2>
        <ul className="space-y-2">
          {data?.organisers.map((o) => (
            <li
              key={o.userId}
              className="flex flex-wrap items-center justify-between gap-2 rounded-lg border border-reed-200 bg-white/70 p-3"
            >
              <span>
                <span className="font-semibold">{o.name ?? o.email}</span>{" "}
                <span className="text-sm">
                  {o.email}
                  {o.userId === selfId ? ` (${t("you")})` : ""} ·{" "}
                  {t("since", { date: format.dateTime(new Date(o.since), { dateStyle: "medium" }) })}
                </span>
              </span>
              <button
                type="button"
                className={secondaryButtonClass}
                disabled={busy}
                onClick={() => void run(() => api.send(`${url}/${o.userId}`, "DELETE"))}
              >
                {o.userId === selfId ? t("leave") : t("remove")}
                {/* Whom it removes, heard with the visible word (axe: label-content-name-mismatch). */}
                <span className="sr-only"> {o.email}</span>
              </button>
            </li>
          ))}
        </ul>
        {problem ? (
          <p role="alert" className="font-semibold text-signal">
            {problem}
          </p>
        ) : null}
      </section>
      <form
        aria-label={t("addOrganiser")}
        className="max-w-prose space-y-2"
        onSubmit={async (e) => {
          e.preventDefault();
          if (await run(() => api.send(url, "POST", { email }))) setEmail("");
        }}
      >
        <h2 className="text-2xl font-bold text-reed-900">{t("addOrganiser")}</h2>
        <Field id="organiser-email" label={t("addEmail")}>
          <input
            id="organiser-email"
            type="email"
            required
            className={inputClass}
            value={email}
            onChange={(e) => setEmail(e.target.value)}
          />
        </Field>
        <button type="submit" className={buttonClass} disabled={busy}>
          {t("add")}
        </button>
      </form>
      <section aria-labelledby="org-log-title" className="space-y-2">
        <h2 id="org-log-title" className="text-2xl font-bold text-reed-900">
          {t("logTitle")}
        </h2>
        {data && data.log.length === 0 ? <p>{t("noLog")}</p> : null}
        <ul className="space-y-1 text-sm">
          {data?.log.map((l) => (
            <li key={l.id}>
              {t("logLine", {
                date: format.dateTime(new Date(l.at), { dateStyle: "medium", timeStyle: "short" }),
                actor: l.actorEmail ?? t("someone"),
                action: t(`actions.${l.action}` as never, { subject: l.subjectEmail ?? "" } as never),
              })}
              {l.reason ? ` — ${l.reason}` : ""}
            </li>
          ))}
        </ul>
      </section>
    </div>
  );
}
