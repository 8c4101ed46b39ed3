"use client";

import { useFormatter, useTranslations } from "next-intl";
import dynamic from "next/dynamic";
import { memo, useEffect, useMemo, useState } from "react";
import type { FieldDatabase } from "@/lib/field/db";
import { deleteUnsent, withdrawSighting } from "@/lib/field/outbox";
import { loadSchemas } from "@/lib/field/save";
import { REJECT_REASONS, type RejectReason } from "@/lib/domain";
import { buildSpeciesIndex } from "@/lib/field/search";
import type { KnownEvent, LocalSighting } from "@/lib/field/types";
import { DeviceStateMark, ReviewStateMark } from "@/components/state-mark";
import { useFocusReturn } from "@/components/ui/focus";
import type { SyncStatus } from "./field-app";
import { FieldMap } from "./field-map";
import { runningSession, SessionPanel } from "./session-panel";
import { useFieldData } from "./use-field-data";
import { usePosition } from "./use-position";

// The sighting form (and the record rules, photo preparation and time-zone code with it) is
// fetched when the person first opens it, from the service worker's precache, not with the
// field log's first load (issue 18).
const SightingForm = dynamic(() => import("./sighting-form").then((m) => m.SightingForm), { ssr: false });

type Props = {
  db: FieldDatabase;
  event: KnownEvent;
  locale: string;
  online: boolean;
  sync: SyncStatus;
  onSyncNow: () => void;
  onSaved: () => void;
  onSwitchEvent?: () => void;
};

const bigButton = "inline-flex min-h-touch items-center justify-center gap-2 rounded-xl px-5 text-lg font-bold";

export function EventLog({ db, event, locale, online, sync, onSyncNow, onSaved, onSwitchEvent }: Props) {
  const t = useTranslations("FieldLog");
  const format = useFormatter();
  const { data, reload, putSighting } = useFieldData(db, event.id);
  const [editing, setEditing] = useState<LocalSighting | "new" | null>(null);
  // Closing the form gives focus back to the button that opened it (keyboard use, issue 17).
  useFocusReturn(editing === null ? null : editing === "new" ? "add-sighting" : `edit-${editing.id}`);
  const position = usePosition(true);
  // The record schemas, ready before the first save (lib/field/save.ts).
  useEffect(() => void loadSchemas().catch(() => {}), []);
  const zones = data.pack?.pack.zones ?? null;
  const index = useMemo(
    () => (data.pack ? buildSpeciesIndex(data.pack.pack.species, locale, data.pack.pack.mostRecorded) : null),
    [data.pack, locale],
  );
  const activeSession = runningSession(data.sessions);
  const zoneName = (id: string | null) => zones?.features.find((f) => f.id === id)?.properties.name ?? null;

  const outboxSessions = data.sessions.filter((s) => s.state !== "sent");
  const outboxSightings = data.sightings.filter((s) => s.state !== "sent").sort((a, b) => b.savedAt - a.savedAt);
  const outboxPhotos = data.photos.filter((p) => p.state !== "sent");
  const sent = data.sightings.filter((s) => s.state === "sent").sort((a, b) => b.savedAt - a.savedAt);
  // A photo travels with its sighting; it counts on its own only once the sighting is sent.
  const loosePhotos = outboxPhotos.filter((p) => !outboxSightings.some((s) => s.id === p.sightingId));
  const waitingCount = outboxSessions.length + outboxSightings.length + loosePhotos.length;
  const problem = [...data.sightings, ...data.sessions].find((r) => r.state === "waiting" && r.problem)?.problem;

  const saved = async () => {
    setEditing(null);
    await reload();
    onSaved();
  };
  // A sighting saved in the form: the stored record joins the list as it is, without reading
  // every record of the event again; only that row is drawn anew (SightingRow is memoised).
  const sightingSaved = (entry: LocalSighting, withPhotos: boolean) => {
    if (withPhotos) return void saved();
    setEditing(null);
    putSighting(entry);
    onSaved();
  };

  if (editing) {
    return (
      <SightingForm
        db={db}
        eventId={event.id}
        timeZone={event.timeZone}
        index={index}
        zones={zones}
        position={position}
        session={activeSession}
        sessions={data.sessions}
        pack={data.pack?.pack ?? null}
        editing={editing === "new" ? null : editing}
        onCancel={() => setEditing(null)}
        onSaved={sightingSaved}
      />
    );
  }

  const remove = async (s: LocalSighting) => {
    await deleteUnsent(db, "sighting", s.id);
    await reload();
    onSaved();
  };
  const withdraw = async (s: LocalSighting) => {
    await withdrawSighting(db, s.id);
    await reload();
    onSaved();
  };
  const day = (iso: string) =>
    format.dateTime(new Date(iso), { day: "numeric", month: "long", year: "numeric", timeZone: event.timeZone });

  // Times in the event's own time zone, as everywhere else in Ecotone (design.md).
  const when = (iso: string) =>
    format.dateTime(new Date(iso), {
      hour: "2-digit",
      minute: "2-digit",
      day: "numeric",
      month: "short",
      timeZone: event.timeZone,
    });

  return (
    <div className="space-y-6">
      <header className="space-y-2">
        <div className="flex flex-wrap items-center justify-between gap-2">
          <h2 className="text-xl font-bold text-reed-900">{event.name}</h2>
          {onSwitchEvent ? (
            <button
              type="button"
              onClick={onSwitchEvent}
              className="min-h-touch rounded-lg px-3 font-semibold text-reed-800 underline"
            >
              {t("switchEvent")}
            </button>
          ) : null}
        </div>
        {event.status !== "open" ? (
          <p className="rounded-lg border-2 border-heath-700 bg-heath-50 p-3 font-semibold text-heath-900">
            {event.status === "draft"
              ? t("eventOpensLater", {
                  start: format.dateTime(new Date(event.startsAt), {
                    dateStyle: "long",
                    timeStyle: "short",
                    timeZone: event.timeZone,
                  }),
                })
              : t("eventNotOpen")}
          </p>
        ) : null}
        <p className="text-ink-soft">{t("reviewUntil", { date: day(event.reviewClosesAt) })}</p>
        <div
          role="status"
          aria-live="polite"
          className="flex flex-wrap items-center gap-x-3 gap-y-1 rounded-lg border-2 border-reed-700 bg-white p-3"
        >
          <span className="font-bold">
            {online ? (
              <>
                <span aria-hidden="true">● </span>
                {t("online")}
              </>
            ) : (
              <>
                <span aria-hidden="true">○ </span>
                {t("offline")}
              </>
            )}
          </span>
          <span>{waitingCount === 0 ? t("outboxEmpty") : t("outboxCount", { count: waitingCount })}</span>
          {sync.running ? <span>{t("sendingNow")}</span> : null}
          {!sync.running && waitingCount > 0 && problem ? (
            <span className="text-heath-900">{t(`problem.${problem}`)}</span>
          ) : null}
        </div>
        {!data.pack && data.loaded ? (
          <p className="rounded-lg border-2 border-heath-700 bg-heath-50 p-3 text-heath-900">
            {online ? t("packLoading") : t("packMissing")}
          </p>
        ) : null}
        <p className="text-ink-soft">{t("timesIn", { zone: event.timeZone })}</p>
        <p>
          <a href="#safety" className="inline-flex min-h-touch items-center font-semibold text-reed-800 underline">
            {t("safetyLink")}
          </a>
        </p>
      </header>

      <SessionPanel
        db={db}
        eventId={event.id}
        timeZone={event.timeZone}
        kinds={data.pack?.pack.event.sessionKinds ?? null}
        zones={zones}
        position={position}
        sessions={data.sessions}
        sightings={data.sightings}
        onSaved={saved}
      />

      <section aria-labelledby="outbox-title" className="space-y-3">
        <div className="flex flex-wrap items-center justify-between gap-2">
          <h2 id="outbox-title" className="text-xl font-bold text-reed-900">
            {t("outboxTitle")}
          </h2>
          {waitingCount > 0 ? (
            <button
              type="button"
              onClick={onSyncNow}
              disabled={sync.running}
              className={`${bigButton} border-2 border-reed-700 text-reed-800 disabled:opacity-60`}
            >
              {t("sendNow")}
            </button>
          ) : null}
        </div>
        {waitingCount === 0 ? (
          <p>{t("outboxEmptyLong")}</p>
        ) : (
          <ul aria-label={t("outboxTitle")} className="space-y-2">
            {outboxSessions.map((s) => (
              <li key={s.id} className="rounded-xl border-2 border-reed-200 bg-white p-3">
                <div className="flex flex-wrap items-center justify-between gap-2">
                  <span className="font-bold">
                    {t(`sessionKind.${s.record.kind}`)}
                    {zoneName(s.record.zoneId) ? ` · ${zoneName(s.record.zoneId)}` : ""}
                    {s.record.cancelled ? ` · ${t("session.cancelled")}` : ""}
                  </span>
                  <DeviceStateMark state={s.state} />
                </div>
                <p className="text-ink-soft">
                  {s.record.endedAt
                    ? t("sessionEndedAt", { time: when(s.record.endedAt) })
                    : t("sessionRunningSince", { time: when(s.record.startedAt) })}
                </p>
                {s.state === "failed" ? <p className="font-semibold text-signal">{s.reason}</p> : null}
              </li>
            ))}
            {outboxSightings.map((s) => (
              <SightingRow
                key={s.id}
                s={s}
                zone={zoneName(s.record.zoneId)}
                when={when(s.record.observedAt)}
                photos={data.photos.filter((p) => p.sightingId === s.id).length}
                onEdit={setEditing}
                onDelete={remove}
              />
            ))}
            {loosePhotos.map((p) => (
              <li
                key={p.id}
                className="flex flex-wrap items-center justify-between gap-2 rounded-xl border-2 border-reed-200 bg-white p-3"
              >
                <span className="font-bold">
                  {t("photoOf", { name: data.sightings.find((s) => s.id === p.sightingId)?.taxonLabel ?? "" })}
                </span>
                <DeviceStateMark state={p.state} />
                {p.state === "failed" ? <p className="w-full font-semibold text-signal">{p.reason}</p> : null}
              </li>
            ))}
          </ul>
        )}
      </section>

      <section aria-labelledby="sent-title" className="space-y-3">
        <h2 id="sent-title" className="text-xl font-bold text-reed-900">
          {t("sentTitle")}
        </h2>
        {sent.length === 0 ? (
          <p>{t("sentEmpty")}</p>
        ) : (
          <ul aria-label={t("sentTitle")} className="space-y-2">
            {sent.map((s) => (
              <SightingRow
                key={s.id}
                s={s}
                zone={zoneName(s.record.zoneId)}
                when={when(s.record.observedAt)}
                photos={data.photos.filter((p) => p.sightingId === s.id).length}
                onEdit={setEditing}
                onWithdraw={withdraw}
              />
            ))}
          </ul>
        )}
      </section>

      {data.pack ? <FieldMap pack={data.pack} sightings={data.sightings} here={position.fix} online={online} /> : null}

      <div className="fixed inset-x-0 bottom-0 z-20 border-t-2 border-reed-800 bg-paper/95 p-3">
        <div className="mx-auto flex max-w-xl">
          <button
            type="button"
            id="add-sighting"
            onClick={() => setEditing("new")}
            disabled={!data.pack || event.status !== "open"}
            className={`${bigButton} min-h-[56px] w-full bg-reed-700 text-paper disabled:opacity-60`}
          >
            <span aria-hidden="true" className="text-2xl leading-none">
              +
            </span>
            {t("addSighting")}
          </button>
        </div>
      </div>
    </div>
  );
}

// One row of the list, drawn again only when what it shows changed: a save, a send or a
// review answer redraws its own row, not every row of the day (issue 18). The handlers are
// given the row's sighting, so their identity does not matter.
const SightingRow = memo(
  SightingRowView,
  (a, b) =>
    a.zone === b.zone &&
    a.when === b.when &&
    a.photos === b.photos &&
    !a.onDelete === !b.onDelete &&
    !a.onWithdraw === !b.onWithdraw &&
    (a.s === b.s || JSON.stringify(a.s) === JSON.stringify(b.s)),
);

function SightingRowView({
  s,
  zone,
  when,
  photos,
  onEdit,
  onDelete,
  onWithdraw,
}: {
  s: LocalSighting;
  zone: string | null;
  when: string;
  photos: number;
  onEdit: (s: LocalSighting) => void;
  onDelete?: (s: LocalSighting) => void | Promise<void>;
  onWithdraw?: (s: LocalSighting) => void | Promise<void>;
}) {
  const t = useTranslations("FieldLog");
  const [confirming, setConfirming] = useState<"delete" | "withdraw" | null>(null);
  const sent = s.state === "sent";
  const returned = s.reviewState === "returned" && sent;
  const unsent = !s.sentAt && (s.state === "waiting" || s.state === "failed");
  // A sent sighting can be corrected while pending, returned or approved, and withdrawn while
  // pending or returned (design.md "correction"); a rejected or withdrawn one stays as it is.
  const correctable = sent && !s.withdrawn && (s.reviewState === "pending" || s.reviewState === "approved");
  const withdrawable = sent && !s.withdrawn && (s.reviewState === "pending" || s.reviewState === "returned");
  const editable = s.state === "waiting" || s.state === "failed" || returned;
  const reason = s.rejectionReason?.split(/[:\s]/)[0] ?? "";
  const small =
    "mt-2 inline-flex min-h-touch items-center rounded-lg border-2 border-reed-700 px-4 font-semibold text-reed-800";
  return (
    <li className={`rounded-xl border-2 bg-white p-3 ${returned ? "border-heath-700" : "border-reed-200"}`}>
      <div className="flex flex-wrap items-center justify-between gap-2">
        <span className="text-lg font-bold">
          {s.taxonLabel}{" "}
          <span className="font-normal">
            · {s.record.countIsEstimate ? t("aboutCount", { count: s.record.count }) : s.record.count}
          </span>
        </span>
        <span className="flex flex-wrap gap-1">
          {s.withdrawn && sent ? (
            <span className="font-semibold text-ink-soft">{t("withdrawn")}</span>
          ) : sent && s.reviewState ? (
            <ReviewStateMark state={s.reviewState} size="large" />
          ) : (
            <DeviceStateMark state={s.state} />
          )}
        </span>
      </div>
      <p className="text-ink-soft">
        {[when, zone, photos ? t("photoCount", { count: photos }) : null].filter(Boolean).join(" · ")}
      </p>
      {s.state === "failed" ? (
        <p className="font-semibold text-signal">
          <span aria-hidden="true">✕ </span>
          {s.reason}
        </p>
      ) : null}
      {sent && s.reviewState === "rejected" && !s.withdrawn && s.rejectionReason ? (
        <p className="mt-1 rounded-lg bg-signal-soft p-2 text-signal">
          <span className="font-bold">{t("rejectedBecause")}</span>{" "}
          {REJECT_REASONS.includes(reason as RejectReason)
            ? t(`rejectReason.${reason as RejectReason}`)
            : s.rejectionReason}
        </p>
      ) : null}
      {s.question ? (
        <p className="mt-1 rounded-lg bg-heath-50 p-2 text-heath-900">
          <span className="font-bold">{t("question")}</span> {s.question}
        </p>
      ) : null}
      {confirming ? (
        <div role="group" aria-label={t(`${confirming}Confirm`)} className="mt-2 rounded-lg border-2 border-signal p-2">
          <p className="font-semibold">{t(`${confirming}Confirm`)}</p>
          <div className="flex flex-wrap gap-2">
            <button
              type="button"
              onClick={() => {
                setConfirming(null);
                void (confirming === "delete" ? onDelete : onWithdraw)?.(s);
              }}
              className={`${small} border-signal bg-signal text-paper`}
            >
              {t(confirming === "delete" ? "deleteYes" : "withdrawYes")}
            </button>
            <button type="button" onClick={() => setConfirming(null)} className={small}>
              {t("keep")}
            </button>
          </div>
        </div>
      ) : (
        <div className="flex flex-wrap gap-2">
          {editable ? (
            <button
              id={`edit-${s.id}`}
              type="button"
              onClick={() => onEdit(s)}
              className={small}
              aria-label={`${returned ? t("answer") : t("edit")}: ${s.taxonLabel}`}
            >
              {returned ? t("answer") : t("edit")}
            </button>
          ) : null}
          {correctable ? (
            <button
              id={`edit-${s.id}`}
              type="button"
              onClick={() => onEdit(s)}
              className={small}
              aria-label={`${t("correct")}: ${s.taxonLabel}`}
            >
              {t("correct")}
            </button>
          ) : null}
          {withdrawable && onWithdraw ? (
            <button
              type="button"
              onClick={() => setConfirming("withdraw")}
              className={small}
              aria-label={`${t("withdraw")}: ${s.taxonLabel}`}
            >
              {t("withdraw")}
            </button>
          ) : null}
          {unsent && onDelete ? (
            <button
              type="button"
              onClick={() => setConfirming("delete")}
              className={small}
              aria-label={`${t("delete")}: ${s.taxonLabel}`}
            >
              {t("delete")}
            </button>
          ) : null}
        </div>
      )}
    </li>
  );
}
