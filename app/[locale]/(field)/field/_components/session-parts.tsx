"use client";

import { useTranslations } from "next-intl";
import { useState } from "react";
import type { FieldDatabase } from "@/lib/field/db";
import { InvalidRecord, saveSession } from "@/lib/field/save";
import type { LocalSession, LocalSighting, ZoneCollection } from "@/lib/field/types";
import { judgeSession } from "@/lib/sync/rules";
import { SESSION_KINDS, type SessionKind } from "@/lib/domain";
import { utcToZonedLocal, zonedLocalToUtc } from "@/lib/time/zoned";

// The parts of the count-session panel beyond starting and ending one: editing a session
// (kind, zone, times, distance), cancelling one with a confirmation that says what happens
// to its sightings, and the summary shown when a session ends.

export const choice =
  "flex min-h-touch cursor-pointer items-center gap-3 rounded-xl border-2 border-reed-700 bg-white px-4 py-2 font-semibold has-[:checked]:bg-reed-700 has-[:checked]:text-paper";
export const button = "inline-flex min-h-touch items-center rounded-xl px-5 text-lg font-bold";
const field = "block min-h-touch w-full rounded-lg border-2 border-reed-700 bg-white px-3 text-lg";

/** The kinds a session at this event may be (the pack's list; all of them before the pack is on the phone). */
export function eventKinds(kinds: string[] | null | undefined): SessionKind[] {
  const allowed = SESSION_KINDS.filter((k) => !kinds || kinds.includes(k));
  return allowed.length ? allowed : [...SESSION_KINDS];
}

type EditorProps = {
  db: FieldDatabase;
  eventId: string;
  timeZone: string;
  kinds: string[] | null;
  zones: ZoneCollection | null;
  session: LocalSession;
  onDone: (saved: boolean) => void;
};

/** Edits a session's kind, zone, times and distance; judged by the same rules as on the server before it is queued. */
/** A walk's distance in metres, as typed (checked at save). */
export function DistanceField({ value, onChange }: { value: string; onChange: (v: string) => void }) {
  const t = useTranslations("FieldLog");
  return (
    <label className="block space-y-1">
      <span className="font-bold">{t("session.distance")}</span>
      <input
        type="number"
        inputMode="numeric"
        min={0}
        value={value}
        onChange={(e) => onChange(e.target.value)}
        className={`${field} w-40`}
      />
    </label>
  );
}

/** The session's kind (of those the event uses) and its zone: starting a session and editing one. */
export function KindAndZone(props: {
  name: string;
  kinds: string[] | null | undefined;
  kind: SessionKind;
  onKind: (k: SessionKind) => void;
  zoneId: string;
  onZone: (id: string) => void;
  zones: ZoneCollection | null | undefined;
  /** The words of the "no zone chosen" option. */
  noZone: string;
}) {
  const t = useTranslations("FieldLog");
  return (
    <>
      <fieldset className="grid gap-2">
        <legend className="mb-1 font-bold">{t("session.kind")}</legend>
        {eventKinds(props.kinds).map((k) => (
          <label key={k} className={choice}>
            <input
              type="radio"
              name={props.name}
              value={k}
              checked={props.kind === k}
              onChange={() => props.onKind(k)}
              className="h-5 w-5"
            />
            {t(`sessionKind.${k}`)}
          </label>
        ))}
      </fieldset>
      <label className="block space-y-1">
        <span className="font-bold">{t("zone")}</span>
        <select value={props.zoneId} onChange={(e) => props.onZone(e.target.value)} className={field}>
          <option value="">{props.noZone}</option>
          {props.zones?.features.map((f) => (
            <option key={f.id} value={f.id}>
              {f.properties.name}
            </option>
          ))}
        </select>
      </label>
    </>
  );
}

export function SessionEditor({ db, eventId, timeZone, kinds, zones, session, onDone }: EditorProps) {
  const t = useTranslations("FieldLog");
  const tSync = useTranslations("FieldSync");
  const rec = session.record;
  const [kind, setKind] = useState<SessionKind>(rec.kind);
  const [zoneId, setZoneId] = useState(rec.zoneId ?? "");
  const [initial] = useState(() => ({
    start: utcToZonedLocal(new Date(rec.startedAt), timeZone),
    end: rec.endedAt ? utcToZonedLocal(new Date(rec.endedAt), timeZone) : "",
  }));
  const [start, setStart] = useState(initial.start);
  const [end, setEnd] = useState(initial.end);
  const [distance, setDistance] = useState(rec.distanceM === null ? "" : String(Math.round(rec.distanceM)));
  const [error, setError] = useState<string | null>(null);

  const save = async () => {
    setError(null);
    let startedAt: string;
    let endedAt: string | null;
    try {
      // An untouched time keeps its seconds, so an edit never moves it by accident.
      startedAt = start === initial.start ? rec.startedAt : zonedLocalToUtc(start, timeZone).toISOString();
      endedAt =
        rec.endedAt === null ? null : end === initial.end ? rec.endedAt : zonedLocalToUtc(end, timeZone).toISOString();
    } catch {
      setError(t("session.timeRequired"));
      return;
    }
    const distanceM = kind === "walk" && distance.trim() !== "" ? Number(distance) : null;
    if (distanceM !== null && (!Number.isFinite(distanceM) || distanceM < 0)) {
      setError(t("session.distanceInvalid"));
      return;
    }
    const next = { ...rec, kind, zoneId: zoneId || null, startedAt, endedAt, distanceM };
    const bad = judgeSession(next, {
      kinds: eventKinds(kinds),
      zoneIds: new Set(zones?.features.map((f) => f.id.toLowerCase()) ?? []),
    });
    if (bad) {
      setError(tSync(`reason.${bad.code}`, bad.values ?? {}));
      return;
    }
    try {
      await saveSession(db, eventId, next);
      onDone(true);
    } catch (err) {
      setError(
        err instanceof InvalidRecord
          ? t("errors.invalid", { fields: err.issues.map((i) => i.field).join(", ") })
          : t("errors.save"),
      );
    }
  };

  return (
    <form
      aria-label={t("session.editTitle")}
      noValidate
      onKeyDown={(e) => {
        if (e.key === "Escape") onDone(false);
      }}
      onSubmit={(e) => {
        e.preventDefault();
        void save();
      }}
      className="space-y-3 rounded-xl border-2 border-reed-700 bg-white p-4"
    >
      <h2 className="text-xl font-bold text-reed-900">{t("session.editTitle")}</h2>
      <KindAndZone
        name="edit-kind"
        kinds={kinds}
        kind={kind}
        onKind={setKind}
        zoneId={zoneId}
        onZone={setZoneId}
        zones={zones}
        noZone={t("session.noZone")}
      />
      <label className="block space-y-1">
        <span className="font-bold">{t("session.startedAt")}</span>
        <input type="datetime-local" value={start} onChange={(e) => setStart(e.target.value)} className={field} />
      </label>
      {rec.endedAt !== null ? (
        <label className="block space-y-1">
          <span className="font-bold">{t("session.endedAt")}</span>
          <input type="datetime-local" value={end} onChange={(e) => setEnd(e.target.value)} className={field} />
        </label>
      ) : null}
      {kind === "walk" ? <DistanceField value={distance} onChange={setDistance} /> : null}
      <p className="text-ink-soft">{t("timesIn", { zone: timeZone })}</p>
      {error ? (
        <p role="alert" className="font-semibold text-signal">
          ✕ {error}
        </p>
      ) : null}
      <div className="flex flex-wrap gap-2">
        <button type="submit" className={`${button} bg-reed-700 text-paper`}>
          {t("session.saveEdit")}
        </button>
        <button
          type="button"
          onClick={() => onDone(false)}
          className={`${button} border-2 border-reed-700 font-semibold text-reed-800`}
        >
          {t("cancel")}
        </button>
      </div>
    </form>
  );
}

/** The session's own buttons: edit it, or cancel it after a confirmation that says what becomes of its sightings. */
export function SessionActions({
  label,
  sightings,
  onEdit,
  onCancel,
}: {
  label: string;
  sightings: number;
  onEdit: () => void;
  onCancel: () => void;
}) {
  const t = useTranslations("FieldLog");
  const [confirming, setConfirming] = useState(false);
  const small =
    "inline-flex min-h-touch items-center rounded-lg border-2 border-reed-700 bg-white px-4 font-semibold text-reed-800";
  if (confirming)
    return (
      <div
        role="group"
        aria-label={t("session.cancelSession")}
        className="rounded-lg border-2 border-signal bg-white p-2"
      >
        <p className="font-semibold">{t("session.cancelConfirm", { count: sightings })}</p>
        <div className="mt-2 flex flex-wrap gap-2">
          <button
            type="button"
            onClick={() => {
              setConfirming(false);
              onCancel();
            }}
            className={`${small} border-signal bg-signal text-paper`}
          >
            {t("session.cancelYes")}
          </button>
          <button type="button" onClick={() => setConfirming(false)} className={small}>
            {t("session.keep")}
          </button>
        </div>
      </div>
    );
  return (
    <div className="flex flex-wrap gap-2">
      <button type="button" onClick={onEdit} className={small} aria-label={`${t("session.edit")}: ${label}`}>
        {t("session.edit")}
      </button>
      <button
        type="button"
        onClick={() => setConfirming(true)}
        className={small}
        aria-label={`${t("session.cancelSession")}: ${label}`}
      >
        {t("session.cancelSession")}
      </button>
    </div>
  );
}

/** What an ended session holds: its effort, its species and individuals, and what is still on the phone. */
export function SessionSummary({
  session,
  sightings,
  onClose,
}: {
  session: LocalSession;
  sightings: LocalSighting[];
  onClose: () => void;
}) {
  const t = useTranslations("FieldLog");
  const rec = session.record;
  const own = sightings.filter((s) => s.record.sessionId === session.id);
  const minutes = rec.endedAt
    ? Math.max(0, Math.round((Date.parse(rec.endedAt) - Date.parse(rec.startedAt)) / 60_000))
    : 0;
  const species = new Set(own.map((s) => s.record.taxonId ?? `?${s.record.description}`)).size;
  const individuals = own.reduce((n, s) => n + s.record.count, 0);
  const waiting = own.filter((s) => s.state !== "sent").length + (session.state !== "sent" ? 1 : 0);
  const rows: [string, string][] = [
    [t("session.summaryDuration"), t("session.minutes", { count: minutes })],
    ...(rec.kind === "walk" && rec.distanceM !== null
      ? [[t("session.summaryDistance"), t("session.metres", { count: Math.round(rec.distanceM) })] as [string, string]]
      : []),
    [t("session.summarySightings"), String(own.length)],
    [t("session.summarySpecies"), String(species)],
    [t("session.summaryIndividuals"), String(individuals)],
    [t("session.summaryWaiting"), String(waiting)],
  ];
  return (
    <section aria-labelledby="summary-title" className="space-y-3 rounded-xl border-2 border-reed-700 bg-reed-50 p-4">
      <h2 id="summary-title" className="text-xl font-bold text-reed-900">
        {t("session.summaryTitle")}: {t(`sessionKind.${rec.kind}`)}
      </h2>
      <dl className="grid grid-cols-2 gap-x-4 gap-y-1 text-lg">
        {rows.map(([k, v]) => (
          <div key={k} className="contents">
            <dt className="font-semibold">{k}</dt>
            <dd>{v}</dd>
          </div>
        ))}
      </dl>
      <button type="button" onClick={onClose} className={`${button} bg-reed-700 text-paper`}>
        {t("session.summaryDone")}
      </button>
    </section>
  );
}
