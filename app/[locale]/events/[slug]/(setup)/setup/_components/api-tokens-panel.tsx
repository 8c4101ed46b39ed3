"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useFormatter, useTranslations } from "next-intl";
import { useState } from "react";
import { useForm } from "react-hook-form";
import useSWR from "swr";
import {
  API_TOKEN_DAYS,
  newApiTokenInput,
  type NewApiTokenInput,
} from "@/app/api/events/[eventId]/setup/api-tokens/schema";
import { applyServerErrors, useErrorText } from "@/components/setup/event-fields";
import { buttonClass, Field, inputClass, secondaryButtonClass } from "@/components/ui/field";
import { api, fetcher } from "@/lib/http/client";

type Token = {
  id: string;
  name: string;
  prefix: string;
  scope: "event" | "organisation";
  eventName: string | null;
  createdAt: string;
  createdByName: string | null;
  expiresAt: string;
  revokedAt: string | null;
  lastUsedAt: string | null;
};
type Listing = { tokens: Token[]; canOrganisation: boolean };

function CreateForm({
  eventId,
  canOrganisation,
  onCreated,
}: {
  eventId: string;
  canOrganisation: boolean;
  onCreated: (secret: string) => void;
}) {
  const t = useTranslations("ApiTokens");
  const text = useErrorText();
  const [problem, setProblem] = useState<string | null>(null);
  const form = useForm<NewApiTokenInput>({
    resolver: zodResolver(newApiTokenInput),
    defaultValues: { name: "", scope: "event", expiresInDays: 90 },
  });
  const { errors, isSubmitting } = form.formState;
  const submit = form.handleSubmit(async (values) => {
    setProblem(null);
    const res = await api.call<{ token: string }>(`/api/events/${eventId}/setup/api-tokens`, {
      method: "POST",
      body: values,
    });
    if (res.ok) {
      form.reset({ ...values, name: "" });
      onCreated(res.data.token);
      return;
    }
    if (!applyServerErrors(form.setError as never, res.error.fields, ["name", "scope", "expiresInDays"]))
      setProblem(res.error.message);
  });
  return (
    <form
      onSubmit={submit}
      noValidate
      aria-labelledby="token-new-title"
      className="space-y-3 rounded-xl border border-reed-200 bg-white/70 p-4"
    >
      <h2 id="token-new-title" className="text-2xl font-bold text-reed-900">
        {t("newTitle")}
      </h2>
      <div className="grid gap-3 sm:grid-cols-3">
        <Field id="token-name" label={t("name")} hint={t("nameHint")} error={text(errors.name?.message)}>
          <input
            id="token-name"
            autoComplete="off"
            className={inputClass}
            aria-invalid={Boolean(errors.name)}
            {...form.register("name")}
          />
        </Field>
        <Field id="token-scope" label={t("scope")} error={text(errors.scope?.message)}>
          <select id="token-scope" className={inputClass} {...form.register("scope")}>
            <option value="event">{t("scopeEvent")}</option>
            {canOrganisation ? <option value="organisation">{t("scopeOrganisation")}</option> : null}
          </select>
        </Field>
        <Field id="token-days" label={t("expiresIn")}>
          <select id="token-days" className={inputClass} {...form.register("expiresInDays", { valueAsNumber: true })}>
            {API_TOKEN_DAYS.map((d) => (
              <option key={d} value={d}>
                {t("days", { count: d })}
              </option>
            ))}
          </select>
        </Field>
      </div>
      {problem ? (
        <p role="alert" className="font-semibold text-signal">
          {problem}
        </p>
      ) : null}
      <button type="submit" className={buttonClass} disabled={isSubmitting}>
        {t("create")}
      </button>
    </form>
  );
}

export function ApiTokensPanel({ eventId, referenceUrl }: { eventId: string; referenceUrl: string }) {
  const t = useTranslations("ApiTokens");
  const format = useFormatter();
  const { data, mutate } = useSWR<Listing>(`/api/events/${eventId}/setup/api-tokens`, fetcher);
  const [secret, setSecret] = useState<string | null>(null);
  const when = (iso: string) => format.dateTime(new Date(iso), { dateStyle: "medium", timeStyle: "short" });
  const state = (k: Token) =>
    k.revokedAt ? t("revoked") : new Date(k.expiresAt) <= new Date() ? t("expired") : t("active");

  return (
    <div className="space-y-6">
      <section aria-labelledby="api-title" className="space-y-2">
        <h2 id="api-title" className="text-2xl font-bold text-reed-900">
          {t("title")}
        </h2>
        <p className="max-w-prose">{t("intro")}</p>
        <p>
          <a href={referenceUrl} className="underline">
            {t("reference")}
          </a>{" "}
          ·{" "}
          <a href="/api/openapi.json" className="underline">
            {t("openapi")}
          </a>
        </p>
      </section>

      <CreateForm
        eventId={eventId}
        canOrganisation={data?.canOrganisation ?? false}
        onCreated={(s) => {
          setSecret(s);
          void mutate();
        }}
      />

      {secret ? (
        <section
          aria-labelledby="token-secret-title"
          className="space-y-2 rounded-xl border-2 border-reed-700 bg-white p-4"
        >
          <h2 id="token-secret-title" className="text-xl font-bold text-reed-900">
            {t("secretTitle")}
          </h2>
          <p role="status">{t("secretOnce")}</p>
          <Field id="token-secret" label={t("secretLabel")}>
            <input
              id="token-secret"
              readOnly
              value={secret}
              className={`${inputClass} font-mono`}
              onFocus={(e) => e.currentTarget.select()}
            />
          </Field>
          <button type="button" className={secondaryButtonClass} onClick={() => setSecret(null)}>
            {t("secretDone")}
          </button>
        </section>
      ) : null}

      <section aria-labelledby="tokens-title" className="space-y-2">
        <h2 id="tokens-title" className="text-2xl font-bold text-reed-900">
          {t("listTitle")}
        </h2>
        {!data ? (
          <p role="status">{t("loading")}</p>
        ) : data.tokens.length === 0 ? (
          <p>{t("none")}</p>
        ) : (
          <div className="overflow-x-auto">
            <table className="w-full text-left text-sm">
              <thead>
                <tr>
                  <th scope="col" className="p-2">
                    {t("name")}
                  </th>
                  <th scope="col" className="p-2">
                    {t("prefix")}
                  </th>
                  <th scope="col" className="p-2">
                    {t("scope")}
                  </th>
                  <th scope="col" className="p-2">
                    {t("created")}
                  </th>
                  <th scope="col" className="p-2">
                    {t("expires")}
                  </th>
                  <th scope="col" className="p-2">
                    {t("lastUsed")}
                  </th>
                  <th scope="col" className="p-2">
                    {t("state")}
                  </th>
                  <th scope="col" className="p-2">
                    <span className="sr-only">{t("actions")}</span>
                  </th>
                </tr>
              </thead>
              <tbody>
                {data.tokens.map((k) => (
                  <tr key={k.id} className="border-t border-reed-200">
                    <th scope="row" className="p-2 font-semibold">
                      {k.name}
                    </th>
                    <td className="p-2 font-mono">{k.prefix}…</td>
                    <td className="p-2">{k.scope === "organisation" ? t("scopeOrganisation") : k.eventName}</td>
                    <td className="p-2">
                      {when(k.createdAt)}
                      {k.createdByName ? ` · ${k.createdByName}` : ""}
                    </td>
                    <td className="p-2">{when(k.expiresAt)}</td>
                    <td className="p-2">{k.lastUsedAt ? when(k.lastUsedAt) : t("never")}</td>
                    <td className="p-2">{state(k)}</td>
                    <td className="p-2">
                      {k.revokedAt ? null : (
                        <button
                          type="button"
                          className={secondaryButtonClass}
                          aria-label={t("revokeWho", { name: k.name })}
                          onClick={async () => {
                            await api.call(`/api/events/${eventId}/setup/api-tokens/${k.id}`, { method: "DELETE" });
                            await mutate();
                          }}
                        >
                          {t("revoke")}
                        </button>
                      )}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
      </section>
    </div>
  );
}
