"use client";

import { useTranslations } from "next-intl";
import { useEffect, useState } from "react";
import type { FieldDatabase } from "@/lib/field/db";
import { saveSession } from "@/lib/field/outbox";
import type { LocalSession, ZoneCollection } from "@/lib/field/types";
import { walkDistanceM, zoneAt, type Fix } from "@/lib/field/zones";
import type { PositionState } from "./use-position";
import { SESSION_KINDS as KINDS, type SessionKind as Kind } from "@/lib/domain";

const trackKey = (id: string) => `track:${id}`;

type Props = {
  db: FieldDatabase;
  eventId: string;
  zones: ZoneCollection | null;
  position: PositionState;
  session: LocalSession | null;
  sightingsInSession: number;
  onSaved: () => void;
};

const choice =
  "flex min-h-touch cursor-pointer items-center gap-3 rounded-xl border-2 border-reed-700 bg-white px-4 py-2 font-semibold has-[:checked]:bg-reed-700 has-[:checked]:text-paper";

/** Start a count session in a zone; end it with the full-list answer ("Is this session's list full?") and its effort. */
export function SessionPanel({ db, eventId, zones, position, session, sightingsInSession, onSaved }: Props) {
  const t = useTranslations("FieldLog");
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

  const start = async () => {
    setError(null);
    const chosen = zoneId || here?.id || null;
    await saveSession(db, eventId, {
      id: crypto.randomUUID(),
      zoneId: chosen,
      kind,
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
    setEnding(false);
    setAllNoted("");
    onSaved();
  };

  if (session) {
    const minutes = Math.max(0, Math.round((now - Date.parse(session.record.startedAt)) / 60_000));
    const zone = zones?.features.find((f) => f.id === session.record.zoneId)?.properties.name;
    return (
      <section aria-labelledby="session-title" className="space-y-3 rounded-xl border-2 border-reed-700 bg-reed-50 p-4">
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
          <button
            type="button"
            onClick={() => void beginEnd()}
            className="inline-flex min-h-touch items-center rounded-xl bg-heath-700 px-5 text-lg font-bold text-paper"
          >
            {t("session.end")}
          </button>
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
              <label className={choice}>
                <input
                  type="radio"
                  name="allNoted"
                  value="yes"
                  checked={allNoted === "yes"}
                  onChange={() => setAllNoted("yes")}
                  className="h-5 w-5"
                />
                {t("session.allNotedYes")}
              </label>
              <label className={choice}>
                <input
                  type="radio"
                  name="allNoted"
                  value="no"
                  checked={allNoted === "no"}
                  onChange={() => setAllNoted("no")}
                  className="h-5 w-5"
                />
                {t("session.allNotedNo")}
              </label>
            </fieldset>
            {session.record.kind === "walk" ? (
              <label className="block space-y-1">
                <span className="font-bold">{t("session.distance")}</span>
                <input
                  type="number"
                  inputMode="numeric"
                  min={0}
                  value={distance}
                  onChange={(e) => setDistance(e.target.value)}
                  className="block min-h-touch w-40 rounded-lg border-2 border-reed-700 bg-white px-3 text-lg"
                />
              </label>
            ) : null}
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
      <fieldset className="grid gap-2">
        <legend className="mb-1 font-bold">{t("session.kind")}</legend>
        {KINDS.map((k) => (
          <label key={k} className={choice}>
            <input
              type="radio"
              name="kind"
              value={k}
              checked={kind === k}
              onChange={() => setKind(k)}
              className="h-5 w-5"
            />
            {t(`sessionKind.${k}`)}
          </label>
        ))}
      </fieldset>
      <label className="block space-y-1">
        <span className="font-bold">{t("zone")}</span>
        <select
          value={zoneId}
          onChange={(e) => setZoneId(e.target.value)}
          className="block min-h-touch w-full rounded-lg border-2 border-reed-700 bg-white px-3 text-lg"
        >
          <option value="">{here ? t("zoneHere", { zone: here.properties.name }) : t("zoneUnknown")}</option>
          {zones?.features.map((f) => (
            <option key={f.id} value={f.id}>
              {f.properties.name}
            </option>
          ))}
        </select>
      </label>
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
}
