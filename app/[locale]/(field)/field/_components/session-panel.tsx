"use client";

import { useFormatter, useTranslations } from "next-intl";
import { useEffect, useState } from "react";
import type { FieldDatabase } from "@/lib/field/db";
import { cancelSession } from "@/lib/field/outbox";
import { saveSession } from "@/lib/field/save";
import type { LocalSession, LocalSighting, ZoneCollection } from "@/lib/field/types";
import { walkDistanceM, zoneAt, type Fix } from "@/lib/field/zones";
import type { PositionState } from "./use-position";
import { type SessionKind as Kind } from "@/lib/domain";
import {
  choice,
  DistanceField,
  eventKinds,
  KindAndZone,
  SessionActions,
  SessionEditor,
  SessionSummary,
} from "./session-parts";

const trackKey = (id: string) => `track:${id}`;

type Props = {
  db: FieldDatabase;
  eventId: string;
  timeZone: string;
  kinds: string[] | null; // the event's session kinds, from the pack
  zones: ZoneCollection | null;
  position: PositionState;
  sessions: LocalSession[];
  sightings: LocalSighting[];
  onSaved: () => void;
};

/** The session that is running, if any (a cancelled one never is). */
export const runningSession = (sessions: LocalSession[]) =>
  sessions.find((s) => s.record.endedAt === null && !s.record.cancelled) ?? null;

/**
 * Start a count session in a zone; end it with the full-list answer ("Is this session's list
 * full?") and its effort, then see its summary; edit or cancel any of the person's sessions.
 */
export function SessionPanel({ db, eventId, timeZone, kinds, zones, position, sessions, sightings, onSaved }: Props) {
  const t = useTranslations("FieldLog");
  const format = useFormatter();
  const session = runningSession(sessions);
  const inSession = (id: string) => sightings.filter((s) => s.record.sessionId === id).length;
  const sightingsInSession = session ? inSession(session.id) : 0;
  const ended = sessions
    .filter((s) => s.record.endedAt !== null && !s.record.cancelled)
    .sort((a, b) => Date.parse(b.record.startedAt) - Date.parse(a.record.startedAt));
  const [editingId, setEditingId] = useState<string | null>(null);
  const [summaryId, setSummaryId] = useState<string | null>(null);
  const [cancelNote, setCancelNote] = useState<number | null>(null);
  const [kind, setKind] = useState<Kind>("timed_count");
  const [zoneId, setZoneId] = useState<string>("");
  const [ending, setEnding] = useState(false);
  const [allNoted, setAllNoted] = useState<"yes" | "no" | "">("");
  const [distance, setDistance] = useState("");
  const [error, setError] = useState<string | null>(null);
  const [now, setNow] = useState(() => Date.now());
  const here = position.fix ? zoneAt(zones, position.fix.latitude, position.fix.longitude) : null;

  useEffect(() => {
    const timer = window.setInterval(() => setNow(Date.now()), 15_000);
    return () => window.clearInterval(timer);
  }, []);

  // A walk's route: the position fixes while it runs, kept on the device.
  useEffect(() => {
    if (!session || session.record.kind !== "walk" || !position.fix) return;
    const fix: Fix = {
      latitude: position.fix.latitude,
      longitude: position.fix.longitude,
      accuracyM: position.fix.accuracyM,
    };
    void (async () => {
      const track = ((await db.get("meta", trackKey(session.id))) as Fix[] | undefined) ?? [];
      await db.put("meta", [...track, fix], trackKey(session.id));
    })();
  }, [db, session, position.fix]);

  const zoneName = (id: string | null) => zones?.features.find((f) => f.id === id)?.properties.name ?? null;
  const labelOf = (s: LocalSession) =>
    [t(`sessionKind.${s.record.kind}`), zoneName(s.record.zoneId)].filter(Boolean).join(" · ");
  const cancel = async (s: LocalSession) => {
    const done = await cancelSession(db, s.id);
    if (summaryId === s.id) setSummaryId(null);
    setCancelNote(done?.detached ?? 0);
    onSaved();
  };

  const start = async () => {
    setError(null);
    setCancelNote(null);
    setSummaryId(null);
    const chosen = zoneId || here?.id || null;
    await saveSession(db, eventId, {
      id: crypto.randomUUID(),
      zoneId: chosen,
      // The event's own kinds only (the first of them when the default is not one).
      kind: eventKinds(kinds).includes(kind) ? kind : eventKinds(kinds)[0]!,
      startedAt: new Date().toISOString(),
      endedAt: null,
      allSpeciesNoted: false,
      distanceM: null,
      notes: "",
    });
    onSaved();
  };

  const beginEnd = async () => {
    if (session?.record.kind === "walk") {
      const track = ((await db.get("meta", trackKey(session.id))) as Fix[] | undefined) ?? [];
      setDistance(String(Math.round(walkDistanceM(track))));
    }
    setEnding(true);
  };

  const end = async () => {
    if (!session) return;
    if (!allNoted) {
      setError(t("session.answerRequired"));
      return;
    }
    const distanceM = session.record.kind === "walk" && distance.trim() !== "" ? Number(distance) : null;
    if (distanceM !== null && (!Number.isFinite(distanceM) || distanceM < 0)) {
      setError(t("session.distanceInvalid"));
      return;
    }
    const endedAt = new Date(Math.max(Date.now(), Date.parse(session.record.startedAt) + 1000)).toISOString();
    await saveSession(db, eventId, { ...session.record, endedAt, allSpeciesNoted: allNoted === "yes", distanceM });
    setSummaryId(session.id);
    setEnding(false);
    setAllNoted("");
    onSaved();
  };

  const renderMain = () => {
    if (session) {
      const minutes = Math.max(0, Math.round((now - Date.parse(session.record.startedAt)) / 60_000));
      const zone = zones?.features.find((f) => f.id === session.record.zoneId)?.properties.name;
      return (
        <section
          aria-labelledby="session-title"
          className="space-y-3 rounded-xl border-2 border-reed-700 bg-reed-50 p-4"
        >
          <h2 id="session-title" className="text-xl font-bold text-reed-900">
            {t("session.running", { kind: t(`sessionKind.${session.record.kind}`) })}
          </h2>
          <p className="text-lg">
            {[
              zone ?? t("session.noZone"),
              t("session.minutes", { count: minutes }),
              t("session.sightings", { count: sightingsInSession }),
            ].join(" · ")}
          </p>
          {!ending ? (
            <>
              <button
                type="button"
                onClick={() => void beginEnd()}
                className="inline-flex min-h-touch items-center rounded-xl bg-heath-700 px-5 text-lg font-bold text-paper"
              >
                {t("session.end")}
              </button>
              <SessionActions
                label={labelOf(session)}
                sightings={sightingsInSession}
                onEdit={() => setEditingId(session.id)}
                onCancel={() => void cancel(session)}
              />
            </>
          ) : (
            <form
              aria-label={t("session.endTitle")}
              onSubmit={(e) => {
                e.preventDefault();
                void end();
              }}
              className="space-y-3"
            >
              <fieldset className="space-y-2">
                <legend className="font-bold">{t("session.allNotedQuestion")}</legend>
                <p className="text-ink-soft">{t("session.allNotedHint")}</p>
                {(["yes", "no"] as const).map((answer) => (
                  <label key={answer} className={choice}>
                    <input
                      type="radio"
                      name="allNoted"
                      value={answer}
                      checked={allNoted === answer}
                      onChange={() => setAllNoted(answer)}
                      className="h-5 w-5"
                    />
                    {answer === "yes" ? t("session.allNotedYes") : t("session.allNotedNo")}
                  </label>
                ))}
              </fieldset>
              {session.record.kind === "walk" ? <DistanceField value={distance} onChange={setDistance} /> : null}
              {error ? (
                <p role="alert" className="font-semibold text-signal">
                  ✕ {error}
                </p>
              ) : null}
              <div className="flex flex-wrap gap-2">
                <button
                  type="submit"
                  className="inline-flex min-h-touch items-center rounded-xl bg-reed-700 px-5 text-lg font-bold text-paper"
                >
                  {t("session.confirmEnd")}
                </button>
                <button
                  type="button"
                  onClick={() => setEnding(false)}
                  className="inline-flex min-h-touch items-center rounded-xl border-2 border-reed-700 px-5 font-semibold text-reed-800"
                >
                  {t("cancel")}
                </button>
              </div>
            </form>
          )}
        </section>
      );
    }

    return (
      <section aria-labelledby="start-title" className="space-y-3 rounded-xl border-2 border-reed-200 bg-white p-4">
        <h2 id="start-title" className="text-xl font-bold text-reed-900">
          {t("session.startTitle")}
        </h2>
        <p className="text-ink-soft">{t("session.startHint")}</p>
        <p role="note" className="rounded-lg border-2 border-heath-600 bg-heath-50 p-2 text-heath-900">
          <span aria-hidden="true">⚠ </span>
          {t("session.safetyReminder")}{" "}
          <a href="#safety" className="font-semibold underline">
            {t("safetyLink")}
          </a>
        </p>
        <KindAndZone
          name="kind"
          kinds={kinds}
          kind={kind}
          onKind={setKind}
          zoneId={zoneId}
          onZone={setZoneId}
          zones={zones}
          noZone={here ? t("zoneHere", { zone: here.properties.name }) : t("zoneUnknown")}
        />
        {error ? (
          <p role="alert" className="font-semibold text-signal">
            ✕ {error}
          </p>
        ) : null}
        <button
          type="button"
          onClick={() => void start()}
          className="inline-flex min-h-touch items-center rounded-xl bg-reed-700 px-5 text-lg font-bold text-paper"
        >
          {t("session.start")}
        </button>
      </section>
    );
  };

  const editing = editingId ? (sessions.find((s) => s.id === editingId && !s.record.cancelled) ?? null) : null;
  const summary = summaryId ? (sessions.find((s) => s.id === summaryId && !s.record.cancelled) ?? null) : null;
  const when = (iso: string) =>
    format.dateTime(new Date(iso), { hour: "2-digit", minute: "2-digit", day: "numeric", month: "short", timeZone });
  return (
    <div className="space-y-6">
      {cancelNote !== null ? (
        <p role="status" className="rounded-lg border-2 border-reed-700 bg-white p-3 font-semibold">
          {t("session.cancelledNote", { count: cancelNote })}
        </p>
      ) : null}
      {editing ? (
        <SessionEditor
          db={db}
          eventId={eventId}
          timeZone={timeZone}
          kinds={kinds}
          zones={zones}
          session={editing}
          onDone={(saved) => {
            setEditingId(null);
            if (saved) onSaved();
          }}
        />
      ) : (
        <>
          {summary ? (
            <SessionSummary session={summary} sightings={sightings} onClose={() => setSummaryId(null)} />
          ) : null}
          {renderMain()}
        </>
      )}
      {ended.length && !editing ? (
        <section aria-labelledby="sessions-title" className="space-y-2">
          <h2 id="sessions-title" className="text-xl font-bold text-reed-900">
            {t("session.listTitle")}
          </h2>
          <ul aria-label={t("session.listTitle")} className="space-y-2">
            {ended.map((s) => (
              <li key={s.id} className="space-y-2 rounded-xl border-2 border-reed-200 bg-white p-3">
                <p className="font-bold">{labelOf(s)}</p>
                <p className="text-ink-soft">
                  {when(s.record.startedAt)} – {when(s.record.endedAt!)} ·{" "}
                  {t("session.sightings", { count: inSession(s.id) })}
                </p>
                <SessionActions
                  label={labelOf(s)}
                  sightings={inSession(s.id)}
                  onEdit={() => setEditingId(s.id)}
                  onCancel={() => void cancel(s)}
                />
              </li>
            ))}
          </ul>
        </section>
      ) : null}
    </div>
  );
}
