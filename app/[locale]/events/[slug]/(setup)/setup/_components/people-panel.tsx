"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useFormatter, useTranslations } from "next-intl";
import { useEffect, useState } from "react";
import { useForm, useWatch } from "react-hook-form";
import useSWR from "swr";
import { inviteInput, type InviteInput } from "@/app/api/events/[eventId]/setup/members/schema";
import {
  EVENT_ROLES,
  TAXON_GROUPS,
  type EventRole as Role,
  type MembershipAction,
  type TaxonGroup as Group,
} from "@/lib/domain";
import { roleChangeInput, type RoleChangeInput } from "@/app/api/events/[eventId]/setup/members/[userId]/schema";
import { buttonClass, Field, inputClass, secondaryButtonClass } from "@/components/ui/field";
import { locales } from "@/lib/i18n/routing";
import { applyServerErrors, useErrorText } from "@/components/setup/event-fields";
import { api, ApiClientError, fetcher } from "@/lib/http/client";

type Member = { userId: string; name: string | null; email: string; role: Role; taxonGroups: Group[] };
type Pending = { id: string; email: string; role: Role; taxonGroups: Group[]; createdAt: string; selfService: boolean };
type LogLine = {
  id: number;
  at: string;
  action: MembershipAction;
  subjectEmail: string;
  fromRole: Role | null;
  toRole: Role | null;
  taxonGroups: Group[] | null;
  actorEmail: string | null;
};
type People = { members: Member[]; pending: Pending[]; log: LogLine[] };

function GroupBoxes({
  register,
  name,
  legend,
}: {
  register: ReturnType<typeof useForm<{ taxonGroups: Group[] }>>["register"];
  name: "taxonGroups";
  legend: string;
}) {
  const tGroup = useTranslations("TaxonGroup");
  return (
    <fieldset className="space-y-1">
      <legend className="text-sm font-semibold">{legend}</legend>
      <div className="flex flex-wrap gap-x-4">
        {TAXON_GROUPS.map((g) => (
          <label key={g} className="flex min-h-touch items-center gap-2 text-sm">
            <input type="checkbox" value={g} className="size-5" {...register(name)} />
            {tGroup(g)}
          </label>
        ))}
      </div>
    </fieldset>
  );
}

function InviteForm({ eventId, locale, onDone }: { eventId: string; locale: string; onDone: () => void }) {
  const t = useTranslations("Setup.people");
  const tRole = useTranslations("Role");
  const tLang = useTranslations("LocaleSwitcher");
  const tSetup = useTranslations("Setup");
  const text = useErrorText();
  const [sent, setSent] = useState<string | null>(null);
  const [problem, setProblem] = useState<string | null>(null);
  const form = useForm<InviteInput>({
    resolver: zodResolver(inviteInput),
    defaultValues: { email: "", name: "", role: "volunteer", taxonGroups: [], locale: locale as InviteInput["locale"] },
  });
  const role = useWatch({ control: form.control, name: "role" });
  // Group limits belong to coordinators only: leaving that role clears them.
  useEffect(() => {
    if (role !== "coordinator") form.setValue("taxonGroups", []);
  }, [role, form]);
  const { errors, isSubmitting } = form.formState;
  const submit = form.handleSubmit(async (values) => {
    setSent(null);
    setProblem(null);
    try {
      await api.send(`/api/events/${eventId}/setup/members`, "POST", {
        ...values,
        taxonGroups: values.role === "coordinator" ? values.taxonGroups : [],
      });
    } catch (err) {
      if (!(err instanceof ApiClientError)) throw err;
      if (!applyServerErrors(form.setError as never, err.fields, ["email", "name", "role", "taxonGroups", "locale"]))
        setProblem(err.message || tSetup("genericError"));
      return;
    }
    setSent(values.email);
    form.reset({ ...values, email: "", name: "", taxonGroups: [] });
    onDone();
  });
  return (
    <form
      onSubmit={submit}
      noValidate
      aria-labelledby="invite-title"
      className="space-y-3 rounded-xl border border-reed-200 bg-white/70 p-4"
    >
      <h2 id="invite-title" className="text-2xl font-bold text-reed-900">
        {t("inviteTitle")}
      </h2>
      <p className="max-w-prose text-sm text-ink-soft">{t("inviteIntro")}</p>
      <div className="grid gap-3 sm:grid-cols-2">
        <Field id="invite-email" label={t("email")} error={text(errors.email?.message)}>
          <input
            id="invite-email"
            type="email"
            autoComplete="off"
            className={inputClass}
            aria-invalid={Boolean(errors.email)}
            {...form.register("email")}
          />
        </Field>
        <Field id="invite-name" label={t("name")} error={text(errors.name?.message)}>
          <input id="invite-name" className={inputClass} {...form.register("name")} />
        </Field>
        <Field id="invite-role" label={t("role")}>
          <select id="invite-role" className={inputClass} {...form.register("role")}>
            {EVENT_ROLES.map((r) => (
              <option key={r} value={r}>
                {tRole(r)}
              </option>
            ))}
          </select>
        </Field>
        <Field id="invite-locale" label={t("mailLanguage")}>
          <select id="invite-locale" className={inputClass} {...form.register("locale")}>
            {locales.map((l) => (
              <option key={l} value={l}>
                {tLang(l)}
              </option>
            ))}
          </select>
        </Field>
      </div>
      {role === "coordinator" ? (
        <GroupBoxes register={form.register as never} name="taxonGroups" legend={t("groupsLegend")} />
      ) : null}
      {errors.taxonGroups ? (
        <p role="alert" className="text-sm font-semibold text-signal">
          ✕ {text(errors.taxonGroups.message)}
        </p>
      ) : null}
      {problem ? (
        <p role="alert" className="font-semibold text-signal">
          ✕ {problem}
        </p>
      ) : null}
      <button type="submit" className={buttonClass} disabled={isSubmitting}>
        {t("sendInvitation")}
      </button>
      {sent ? (
        <p role="status" className="font-semibold text-reed-700">
          ✓ {t("invitationSent", { email: sent })}
        </p>
      ) : null}
    </form>
  );
}

function MemberRow({ eventId, member, onDone }: { eventId: string; member: Member; onDone: () => void }) {
  const t = useTranslations("Setup.people");
  const tRole = useTranslations("Role");
  const tSetup = useTranslations("Setup");
  const text = useErrorText();
  const [confirming, setConfirming] = useState(false);
  const [problem, setProblem] = useState<string | null>(null);
  const form = useForm<RoleChangeInput>({
    resolver: zodResolver(roleChangeInput),
    defaultValues: { role: member.role, taxonGroups: member.taxonGroups },
  });
  const role = useWatch({ control: form.control, name: "role" });
  useEffect(() => {
    if (role !== "coordinator") form.setValue("taxonGroups", []);
  }, [role, form]);
  const url = `/api/events/${eventId}/setup/members/${member.userId}`;
  const who = member.name ? `${member.name} (${member.email})` : member.email;
  // A refusal shows the server's words; no answer at all, the general one.
  const attempt = async (call: () => Promise<unknown>) => {
    setProblem(null);
    try {
      await call();
    } catch (err) {
      if (!(err instanceof ApiClientError)) throw err;
      setProblem(err.problem || tSetup("genericError"));
      return;
    }
    onDone();
  };
  const submit = form.handleSubmit((values) =>
    attempt(() =>
      api.send(url, "PATCH", { ...values, taxonGroups: values.role === "coordinator" ? values.taxonGroups : [] }),
    ),
  );
  const remove = () => attempt(() => api.send(url, "DELETE"));
  return (
    <li className="space-y-2 rounded-lg border border-reed-200 bg-white/70 p-3">
      <p className="font-semibold">{who}</p>
      <form
        onSubmit={submit}
        noValidate
        aria-label={t("changeRoleOf", { who: member.email })}
        className="flex flex-wrap items-end gap-3"
      >
        <div>
          <label htmlFor={`role-${member.userId}`} className="block text-sm font-semibold">
            {t("roleOf", { who: member.email })}
          </label>
          <select id={`role-${member.userId}`} className={`${inputClass} w-auto`} {...form.register("role")}>
            {EVENT_ROLES.map((r) => (
              <option key={r} value={r}>
                {tRole(r)}
              </option>
            ))}
          </select>
        </div>
        {role === "coordinator" ? (
          <div className="basis-full">
            <GroupBoxes register={form.register as never} name="taxonGroups" legend={t("groupsLegend")} />
          </div>
        ) : null}
        <button type="submit" className={secondaryButtonClass} disabled={form.formState.isSubmitting}>
          {t("saveRole")}
        </button>
        {confirming ? (
          <button type="button" className={`${secondaryButtonClass} border-signal text-signal`} onClick={remove}>
            {t("confirmRemove", { who: member.email })}
          </button>
        ) : (
          <button
            type="button"
            className={secondaryButtonClass}
            onClick={() => setConfirming(true)}
            aria-label={t("removeWho", { who: member.email })}
          >
            {t("remove")}
          </button>
        )}
      </form>
      {form.formState.errors.taxonGroups ? (
        <p role="alert" className="text-sm font-semibold text-signal">
          ✕ {text(form.formState.errors.taxonGroups.message)}
        </p>
      ) : null}
      {problem ? (
        <p role="alert" className="text-sm font-semibold text-signal">
          ✕ {problem}
        </p>
      ) : null}
    </li>
  );
}

export function PeoplePanel({
  eventId,
  locale,
  joinUrlBase,
}: {
  eventId: string;
  locale: string;
  joinUrlBase: string;
}) {
  const t = useTranslations("Setup.people");
  const tRole = useTranslations("Role");
  const tGroup = useTranslations("TaxonGroup");
  const format = useFormatter();
  const { data, mutate } = useSWR<People>(`/api/events/${eventId}/setup/members`, fetcher);
  const { data: details, mutate: mutateDetails } = useSWR<{ joinCode: string | null }>(
    `/api/events/${eventId}/setup`,
    fetcher,
  );
  const refresh = () => {
    void mutate();
  };
  const groups = (g: Group[] | null) =>
    g?.length ? t("limitedTo", { groups: g.map((x) => tGroup(x)).join(", ") }) : "";

  return (
    <div className="space-y-6">
      <section aria-labelledby="join-title" className="space-y-2 rounded-xl border border-reed-200 bg-white/70 p-4">
        <h2 id="join-title" className="text-2xl font-bold text-reed-900">
          {t("joinTitle")}
        </h2>
        <p className="max-w-prose text-sm text-ink-soft">{t("joinIntro")}</p>
        {details?.joinCode ? (
          <dl className="grid gap-1 sm:grid-cols-[auto_1fr] sm:gap-x-4">
            <dt className="font-semibold">{t("joinLink")}</dt>
            <dd className="break-all font-mono">{`${joinUrlBase}/${details.joinCode}`}</dd>
            <dt className="font-semibold">{t("joinCode")}</dt>
            <dd className="font-mono text-lg">{details.joinCode}</dd>
          </dl>
        ) : (
          <p>{t("noJoinCode")}</p>
        )}
        <button
          type="button"
          className={secondaryButtonClass}
          onClick={async () => {
            await api.send(`/api/events/${eventId}/setup/join-code`, "POST").catch(() => undefined);
            await mutateDetails();
          }}
        >
          {t("newCode")}
        </button>
      </section>

      <InviteForm eventId={eventId} locale={locale} onDone={refresh} />

      <section aria-labelledby="members-title" className="space-y-2">
        <h2 id="members-title" className="text-2xl font-bold text-reed-900">
          {t("membersTitle", { count: data?.members.length ?? 0 })}
        </h2>
        {!data ? (
          <p role="status">{t("loading")}</p>
        ) : data.members.length === 0 ? (
          <p>{t("noMembers")}</p>
        ) : (
          <ul className="space-y-2">
            {data.members.map((m) => (
              <MemberRow
                key={`${m.userId}:${m.role}:${m.taxonGroups.join()}`}
                eventId={eventId}
                member={m}
                onDone={refresh}
              />
            ))}
          </ul>
        )}
      </section>

      <section aria-labelledby="pending-title" className="space-y-2">
        <h2 id="pending-title" className="text-2xl font-bold text-reed-900">
          {t("pendingTitle")}
        </h2>
        {!data?.pending.length ? (
          <p>{t("noPending")}</p>
        ) : (
          <ul className="space-y-2">
            {data.pending.map((p) => (
              <li
                key={p.id}
                className="flex flex-wrap items-center justify-between gap-2 rounded-lg border border-reed-200 p-3"
              >
                <span>
                  {t("pendingLine", { email: p.email, role: tRole(p.role) })} {groups(p.taxonGroups)}{" "}
                  {p.selfService ? t("selfService") : ""}
                </span>
                <button
                  type="button"
                  className={secondaryButtonClass}
                  aria-label={t("withdrawWho", { who: p.email })}
                  onClick={async () => {
                    await api.send(`/api/events/${eventId}/setup/invitations/${p.id}`, "DELETE").catch(() => undefined);
                    refresh();
                  }}
                >
                  {t("withdraw")}
                </button>
              </li>
            ))}
          </ul>
        )}
      </section>

      <section aria-labelledby="log-title" className="space-y-2">
        <h2 id="log-title" className="text-2xl font-bold text-reed-900">
          {t("logTitle")}
        </h2>
        {!data?.log.length ? (
          <p>{t("noLog")}</p>
        ) : (
          <ol className="space-y-1 text-sm">
            {data.log.map((l) => (
              <li key={l.id}>
                <time dateTime={l.at} className="tabular-nums text-ink-soft">
                  {format.dateTime(new Date(l.at), { dateStyle: "short", timeStyle: "short" })}
                </time>{" "}
                {t(`log.${l.action}`, {
                  who: l.subjectEmail,
                  from: l.fromRole ? tRole(l.fromRole) : "",
                  to: l.toRole ? tRole(l.toRole) : "",
                  by: l.actorEmail ?? t("bySelf"),
                })}{" "}
                {groups(l.taxonGroups)}
              </li>
            ))}
          </ol>
        )}
      </section>
    </div>
  );
}
