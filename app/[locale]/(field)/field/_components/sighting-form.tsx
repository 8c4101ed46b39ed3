"use client";

import { useTranslations } from "next-intl";
import { useEffect, useMemo, useRef, useState } from "react";
import type { SightingRecord } from "@/lib/sync/records";
import type { FieldDatabase } from "@/lib/field/db";
import { InvalidRecord, saveSighting } from "@/lib/field/save";
import { preparePhoto, type PreparedPhoto } from "@/lib/field/photo";
import { recordUsage, type SpeciesHit, type SpeciesIndex, type Usage } from "@/lib/field/search";
import type { EventPack, LocalSession, LocalSighting, ZoneCollection } from "@/lib/field/types";
import { GROUP_THRESHOLDS, judgeSighting, sightingCautions, type Caution } from "@/lib/sync/rules";
import { zoneAt } from "@/lib/field/zones";
import { utcToZonedLocal, zonedLocalToUtc } from "@/lib/time/zoned";
import { RealMap } from "@/components/map/real-map";
import type { PositionState } from "./use-position";

type Props = {
  db: FieldDatabase;
  eventId: string;
  timeZone: string; // the event's: the time field reads and writes its wall clock
  index: SpeciesIndex | null;
  zones: ZoneCollection | null;
  position: PositionState;
  session: LocalSession | null;
  sessions: LocalSession[]; // all of the person's sessions here: a sighting is judged against its own session's times
  pack: EventPack | null; // the event's dates and area, and the species' groups, for the checks at save
  editing: LocalSighting | null;
  onCancel: () => void;
  onSaved: (entry: LocalSighting, withPhotos: boolean) => void; // the record as stored
};

type Place = { latitude: number; longitude: number; accuracyM: number; manual: boolean };
type Errors = Partial<Record<"species" | "description" | "count" | "location" | "answer" | "time" | "form", string>>;

const USAGE = "usage";
const SAVE_MARK = "ecotone:save-sighting:start";
const input =
  "block min-h-touch w-full rounded-lg border-2 border-reed-700 bg-white px-3 text-lg text-ink aria-[invalid=true]:border-signal";
const label = "block text-lg font-bold";

// Where a rule's refusal shows in the form (the rule names the record's field).
const FIELD_OF: Record<string, keyof Errors> = {
  observedAt: "time",
  count: "count",
  description: "description",
  taxonId: "species",
};

/** Adding (or editing, or answering) a sighting in a few taps. */
export function SightingForm({
  db,
  eventId,
  timeZone,
  index,
  zones,
  position,
  session,
  sessions,
  pack,
  editing,
  onCancel,
  onSaved,
}: Props) {
  const t = useTranslations("FieldLog");
  const tSync = useTranslations("FieldSync");
  const tDesk = useTranslations("ReviewDesk");
  const prior = editing?.record;
  const [query, setQuery] = useState("");
  const [usage, setUsage] = useState<Usage>({});
  const [species, setSpecies] = useState<{ taxonId: string; label: string; sensitive?: boolean } | null>(
    prior?.taxonId ? { taxonId: prior.taxonId, label: editing!.taxonLabel } : null,
  );
  const [unidentified, setUnidentified] = useState(Boolean(prior && !prior.taxonId));
  const [description, setDescription] = useState(prior?.description ?? "");
  const [count, setCount] = useState(prior?.count ?? 1);
  const [about, setAbout] = useState(prior?.countIsEstimate ?? false);
  const [initialTime] = useState(() => utcToZonedLocal(new Date(prior?.observedAt ?? Date.now()), timeZone));
  const [time, setTime] = useState(initialTime);
  const [place, setPlace] = useState<Place | null>(
    prior ? { latitude: prior.latitude, longitude: prior.longitude, accuracyM: prior.accuracyM, manual: true } : null,
  );
  const [zoneChoice, setZoneChoice] = useState<string>(prior?.zoneId ?? "");
  const [showMap, setShowMap] = useState(false);
  const [notes, setNotes] = useState(prior?.notes ?? "");
  const [answer, setAnswer] = useState("");
  const [photos, setPhotos] = useState<(PreparedPhoto & { url: string })[]>([]);
  const [photoBusy, setPhotoBusy] = useState(false);
  const [errors, setErrors] = useState<Errors>({});
  // A save under way (a ref, not state: nothing re-renders while the record is written).
  const saving = useRef(false);
  // Check marks the phone already sees, said once before saving; the same set again saves.
  const [cautions, setCautions] = useState<Caution[]>([]);
  const answering = editing?.state === "sent" && editing.reviewState === "returned";
  // A sent sighting edited otherwise is a correction: a new version for the server.
  const correcting = editing?.state === "sent" && !answering;
  const searchRef = useRef<HTMLInputElement>(null);
  const headingRef = useRef<HTMLHeadingElement>(null);
  const barRef = useRef<HTMLDivElement>(null);

  useEffect(() => {
    void db.get("meta", USAGE).then((u) => setUsage((u as Usage | undefined) ?? {}));
    // A new sighting starts at the species search; an edit at its title, read first.
    (prior ? headingRef.current : searchRef.current)?.focus();
  }, [db, prior]);
  useEffect(() => () => photos.forEach((p) => URL.revokeObjectURL(p.url)), [photos]);

  // Where: the phone's position, unless placed by hand.
  const fix = position.fix;
  const where: Place | null = place ?? (fix ? { ...fix, manual: false } : null);
  const autoZone = where ? zoneAt(zones, where.latitude, where.longitude) : null;
  const zoneId = zoneChoice || autoZone?.id || null;
  const hits: SpeciesHit[] = useMemo(() => (index ? index.search(query, usage, 12) : []), [index, query, usage]);

  const addPhotos = async (files: FileList | null) => {
    if (!files?.length) return;
    setPhotoBusy(true);
    try {
      const prepared = await Promise.all([...files].slice(0, 5).map(preparePhoto));
      setPhotos((p) => [...p, ...prepared.map((x) => ({ ...x, url: URL.createObjectURL(x.blob) }))]);
    } catch {
      setErrors((e) => ({ ...e, form: t("errors.photo") }));
    } finally {
      setPhotoBusy(false);
    }
  };

  const save = async () => {
    // The save's own timing (read by scripts/bench-lighthouse.mts): from the tap to the record stored.
    if (saving.current) return;
    performance.mark(SAVE_MARK);
    const next: Errors = {};
    if (!unidentified && !species) next.species = t("errors.species");
    if (unidentified && !description.trim()) next.description = t("errors.description");
    if (!Number.isInteger(count) || count < 1) next.count = t("errors.count");
    if (!where) next.location = t("errors.location");
    // An untouched time keeps its seconds, so a correction never changes it by accident.
    let observed = new Date(NaN);
    try {
      observed = prior && time === initialTime ? new Date(prior.observedAt) : zonedLocalToUtc(time, timeZone);
    } catch {
      // not a date-time: reported just below
    }
    if (Number.isNaN(observed.getTime())) next.time = t("errors.time");
    if (answering && !answer.trim()) next.answer = t("errors.answer");
    // Errors are set only when there are some to show or to clear, so a clean save renders nothing until it is done.
    if (Object.keys(next).length > 0 || Object.keys(errors).length > 0) setErrors(next);
    if (Object.keys(next).length > 0 || !where) return;
    const record: SightingRecord = {
      id: prior?.id ?? crypto.randomUUID(),
      sessionId: prior ? prior.sessionId : (session?.id ?? null),
      taxonId: unidentified ? null : species!.taxonId,
      description: unidentified ? description.trim() : "",
      count,
      countIsEstimate: about,
      observedAt: observed.toISOString(),
      latitude: where.latitude,
      longitude: where.longitude,
      accuracyM: where.accuracyM,
      zoneId,
      notes: notes.trim(),
      photoIds: prior?.photoIds ?? [],
      ...(answering ? { answer: { toVersion: editing!.serverVersion ?? 1, message: answer.trim() } } : {}),
      // A correction still waiting keeps the version it corrects when edited again.
      ...(correcting
        ? { correction: { toVersion: editing!.serverVersion ?? 1 } }
        : !answering && prior?.correction
          ? { correction: prior.correction }
          : {}),
    };
    // The server's own rules, at save, before anything is queued: the same reason it would answer.
    const own = sessions.find((x) => x.id === record.sessionId) ?? null;
    const refusal = judgeSighting(record, { now: Date.now(), knownTaxa: null, session: own?.record ?? null });
    if (refusal) {
      setErrors({ [FIELD_OF[refusal.field] ?? "form"]: tSync(`reason.${refusal.code}`, refusal.values ?? {}) });
      return;
    }
    if (pack) {
      const group = pack.species.find((x) => x.id === record.taxonId)?.taxonGroup;
      const found = sightingCautions(record, {
        startsAt: pack.event.startsAt,
        endsAt: pack.event.endsAt,
        area: pack.event.area,
        highCountAbove: group ? GROUP_THRESHOLDS[group] : null,
      });
      if (found.length && found.join() !== cautions.join()) {
        setCautions(found);
        return;
      }
    }
    saving.current = true;
    try {
      const entry = await saveSighting(
        db,
        eventId,
        record,
        unidentified ? t("unidentified") : species!.label,
        photos.map(({ url: _url, ...p }) => p),
      );
      // The species' use count (the search's order) is kept without holding up the save.
      if (!unidentified && species) void db.put("meta", recordUsage(usage, species.taxonId), USAGE).catch(() => {});
      performance.measure("ecotone:save-sighting", SAVE_MARK);
      onSaved(entry, photos.length > 0);
    } catch (err) {
      saving.current = false;
      setErrors({
        form:
          err instanceof InvalidRecord
            ? t("errors.invalid", { fields: err.issues.map((i) => i.field).join(", ") })
            : t("errors.save"),
      });
    }
  };

  return (
    <form
      aria-label={editing ? t("editTitle") : t("addTitle")}
      noValidate
      onKeyDown={(e) => {
        if (e.key === "Escape") onCancel(); // Esc closes the form, as the desk's Esc closes its pane
      }}
      onSubmit={(e) => {
        e.preventDefault();
        void save();
      }}
      // A control that takes the focus partly under the fixed Save bar is scrolled clear of it
      // (the browser only scrolls what is outside the window, scroll margins are not honoured by
      // every browser's focus scrolling nor when the on-screen keyboard opens; issue 17).
      onFocus={(e) => {
        const bar = barRef.current;
        if (!bar || bar.contains(e.target)) return;
        const over = e.target.getBoundingClientRect().bottom - bar.getBoundingClientRect().top + 8;
        if (over > 0) window.scrollBy({ top: over });
      }}
      // A focused field scrolls clear of the fixed Save bar (56 px button, padding and border).
      className="space-y-5 [&_a]:scroll-mb-32 [&_button]:scroll-mb-32 [&_input]:scroll-mb-32 [&_select]:scroll-mb-32 [&_textarea]:scroll-mb-32"
    >
      <h2 ref={headingRef} tabIndex={-1} className="text-2xl font-bold text-reed-900">
        {answering ? t("answerTitle") : correcting ? t("correctTitle") : editing ? t("editTitle") : t("addTitle")}
      </h2>
      {answering && editing?.question ? (
        <p className="rounded-lg border-2 border-heath-700 bg-heath-50 p-3 text-heath-900">
          <span className="font-bold">{t("question")}</span> {editing.question}
        </p>
      ) : null}
      {session && !prior ? (
        <p className="rounded-lg bg-reed-50 p-2 font-semibold text-reed-900">
          {t("inSession", { kind: t(`sessionKind.${session.record.kind}`) })}
        </p>
      ) : null}

      <div className="space-y-2">
        {species && !unidentified ? (
          <div className="flex flex-wrap items-center justify-between gap-2 rounded-xl border-2 border-reed-700 bg-reed-50 p-3">
            <p>
              <span className="block text-sm font-bold">{t("species")}</span>
              <span className="text-xl font-bold">{species.label}</span>
            </p>
            <button
              id="change-species"
              type="button"
              onClick={() => {
                setSpecies(null);
                setQuery("");
                requestAnimationFrame(() => searchRef.current?.focus());
              }}
              className="min-h-touch rounded-lg border-2 border-reed-700 px-4 font-semibold text-reed-800"
            >
              {t("changeSpecies")}
            </button>
            {species.sensitive ? (
              <p role="note" className="w-full rounded-lg border-2 border-heath-600 bg-heath-50 p-2 text-heath-900">
                <span aria-hidden="true">⚠ </span>
                {t("sensitiveCaution")}
              </p>
            ) : null}
          </div>
        ) : !unidentified ? (
          <>
            <label htmlFor="species-search" className={label}>
              {t("species")}
            </label>
            <input
              id="species-search"
              ref={searchRef}
              type="search"
              autoComplete="off"
              value={query}
              onChange={(e) => setQuery(e.target.value)}
              placeholder={t("speciesPlaceholder")}
              aria-invalid={Boolean(errors.species)}
              aria-describedby={errors.species ? "species-error" : undefined}
              className={input}
            />
            {errors.species ? (
              <p id="species-error" role="alert" className="font-semibold text-signal">
                ✕ {errors.species}
              </p>
            ) : null}
            <ul aria-label={t("speciesResults")} className="max-h-80 space-y-1 overflow-y-auto">
              {hits.map((h) => (
                <li key={h.taxonId}>
                  <button
                    type="button"
                    onClick={() => {
                      setSpecies({ taxonId: h.taxonId, label: h.label, sensitive: h.sensitivity !== "open" });
                      // The list goes with the choice: focus stays in the form, on the chosen species' Change.
                      requestAnimationFrame(() => document.getElementById("change-species")?.focus());
                    }}
                    className="flex min-h-touch w-full flex-col items-start rounded-lg border-2 border-reed-200 bg-white px-3 py-2 text-start"
                  >
                    <span className="text-lg font-bold">
                      {h.label}
                      {!h.onList ? (
                        <span className="ms-2 text-sm font-semibold text-heath-900">({t("notOnList")})</span>
                      ) : null}
                    </span>
                    <span className="italic text-ink-soft">{h.scientificName}</span>
                  </button>
                </li>
              ))}
              {query && hits.length === 0 ? <li className="p-2">{t("noSpeciesFound")}</li> : null}
            </ul>
          </>
        ) : null}
        <label className="flex min-h-touch items-center gap-3 font-semibold">
          <input
            type="checkbox"
            checked={unidentified}
            onChange={(e) => setUnidentified(e.target.checked)}
            className="h-6 w-6"
          />
          {t("unidentifiedToggle")}
        </label>
        {unidentified ? (
          <div className="space-y-1">
            <label htmlFor="description" className={label}>
              {t("description")}
            </label>
            <p id="description-hint" className="text-ink-soft">
              {t("descriptionHint")}
            </p>
            <textarea
              id="description"
              value={description}
              onChange={(e) => setDescription(e.target.value)}
              rows={3}
              aria-invalid={Boolean(errors.description)}
              aria-describedby="description-hint"
              className={`${input} py-2`}
            />
            {errors.description ? (
              <p role="alert" className="font-semibold text-signal">
                ✕ {errors.description}
              </p>
            ) : null}
          </div>
        ) : null}
      </div>

      <fieldset className="space-y-2">
        <legend className={label}>{t("count")}</legend>
        <div className="flex items-center gap-2">
          <button
            type="button"
            onClick={() => setCount((c) => Math.max(1, c - 1))}
            aria-label={t("countLess")}
            className="h-14 w-14 rounded-xl border-2 border-reed-700 bg-white text-3xl font-bold text-reed-900"
          >
            −
          </button>
          <input
            type="number"
            inputMode="numeric"
            min={1}
            aria-label={t("count")}
            value={count}
            onChange={(e) => setCount(Math.max(0, Math.floor(Number(e.target.value) || 0)))}
            aria-invalid={Boolean(errors.count)}
            className="h-14 w-24 rounded-xl border-2 border-reed-700 bg-white text-center text-2xl font-bold"
          />
          <button
            type="button"
            onClick={() => setCount((c) => c + 1)}
            aria-label={t("countMore")}
            className="h-14 w-14 rounded-xl border-2 border-reed-700 bg-white text-3xl font-bold text-reed-900"
          >
            +
          </button>
        </div>
        <label className="flex min-h-touch items-center gap-3 font-semibold">
          <input type="checkbox" checked={about} onChange={(e) => setAbout(e.target.checked)} className="h-6 w-6" />
          {t("about")}
        </label>
        {errors.count ? (
          <p role="alert" className="font-semibold text-signal">
            ✕ {errors.count}
          </p>
        ) : null}
      </fieldset>

      <div className="space-y-2">
        <p className={label}>{t("where")}</p>
        <p role="status" className="text-lg">
          {where
            ? t(where.manual ? "placedByHand" : "placedByPhone", {
                lat: where.latitude.toFixed(5),
                lon: where.longitude.toFixed(5),
                accuracy: Math.round(where.accuracyM),
              })
            : position.error
              ? t(`locationError.${position.error}`)
              : t("locating")}
        </p>
        {errors.location ? (
          <p role="alert" className="font-semibold text-signal">
            ✕ {errors.location}
          </p>
        ) : null}
        <div className="flex flex-wrap gap-2">
          {zones ? (
            <button
              type="button"
              onClick={() => setShowMap((v) => !v)}
              aria-expanded={showMap}
              className="min-h-touch rounded-lg border-2 border-reed-700 px-4 font-semibold text-reed-800"
            >
              {showMap ? t("hideMap") : t("placeByHand")}
            </button>
          ) : null}
          {place && fix ? (
            <button
              type="button"
              onClick={() => setPlace(null)}
              className="min-h-touch rounded-lg border-2 border-reed-700 px-4 font-semibold text-reed-800"
            >
              {t("usePhonePosition")}
            </button>
          ) : null}
        </div>
        {showMap && zones ? (
          <figure className="space-y-1">
            <RealMap
              zones={zones.features.map((f) => ({ id: f.id, name: f.properties.name, geometry: f.geometry }))}
              point={
                where ? { latitude: where.latitude, longitude: where.longitude, accuracyM: where.accuracyM } : null
              }
              here={fix && place ? fix : null}
              label={t("mapLabel")}
              onPlace={(p) => setPlace({ ...p, manual: true })}
              className="h-80 w-full touch-none rounded-lg border-2 border-reed-700"
            />
            <figcaption className="text-sm text-ink-soft">{t("mapHint")}</figcaption>
          </figure>
        ) : null}
        <label className="block space-y-1">
          <span className="font-bold">{t("zone")}</span>
          <select value={zoneChoice} onChange={(e) => setZoneChoice(e.target.value)} className={input}>
            <option value="">{autoZone ? t("zoneHere", { zone: autoZone.properties.name }) : t("zoneUnknown")}</option>
            {zones?.features.map((f) => (
              <option key={f.id} value={f.id}>
                {f.properties.name}
              </option>
            ))}
          </select>
        </label>
      </div>

      <div className="space-y-1">
        <label htmlFor="observed-at" className={label}>
          {t("when")}
        </label>
        <input
          id="observed-at"
          type="datetime-local"
          value={time}
          onChange={(e) => setTime(e.target.value)}
          aria-invalid={Boolean(errors.time)}
          className={input}
        />
        {errors.time ? (
          <p role="alert" className="font-semibold text-signal">
            ✕ {errors.time}
          </p>
        ) : null}
      </div>

      <div className="space-y-2">
        <label htmlFor="photo" className={label}>
          {t("photos")}
        </label>
        <input
          id="photo"
          type="file"
          accept="image/jpeg,image/png,image/webp"
          capture="environment"
          multiple
          onChange={(e) => void addPhotos(e.target.files)}
          className="block min-h-touch w-full text-lg file:me-3 file:min-h-touch file:rounded-lg file:border-2 file:border-reed-700 file:bg-white file:px-4 file:font-semibold"
        />
        {photoBusy ? <p role="status">{t("photoPreparing")}</p> : null}
        {photos.length ? (
          <ul className="flex flex-wrap gap-2" aria-label={t("photosChosen")}>
            {photos.map((p, i) => (
              <li key={p.id}>
                {/* eslint-disable-next-line @next/next/no-img-element */}
                <img
                  src={p.url}
                  alt={t("photoAlt", { n: i + 1 })}
                  className="h-20 w-20 rounded-lg border-2 border-reed-700 object-cover"
                />
              </li>
            ))}
          </ul>
        ) : null}
      </div>

      <div className="space-y-1">
        <label htmlFor="notes" className={label}>
          {t("notes")}
        </label>
        <textarea
          id="notes"
          value={notes}
          onChange={(e) => setNotes(e.target.value)}
          rows={2}
          className={`${input} py-2`}
        />
      </div>

      {answering ? (
        <div className="space-y-1">
          <label htmlFor="answer" className={label}>
            {t("yourAnswer")}
          </label>
          <textarea
            id="answer"
            value={answer}
            onChange={(e) => setAnswer(e.target.value)}
            rows={3}
            aria-invalid={Boolean(errors.answer)}
            className={`${input} py-2`}
          />
          {errors.answer ? (
            <p role="alert" className="font-semibold text-signal">
              ✕ {errors.answer}
            </p>
          ) : null}
        </div>
      ) : null}

      {errors.form ? (
        <p role="alert" className="font-semibold text-signal">
          ✕ {errors.form}
        </p>
      ) : null}
      {cautions.length ? (
        <div role="alert" className="space-y-1 rounded-lg border-2 border-heath-700 bg-heath-50 p-3 text-heath-900">
          <p className="font-bold">
            <span aria-hidden="true">⚠ </span>
            {t("caution.intro")}
          </p>
          <ul className="list-disc ps-6">
            {cautions.map((c) => (
              <li key={c}>{tDesk(`marks.${c}`)}</li>
            ))}
          </ul>
          <p>{t("caution.hint")}</p>
        </div>
      ) : null}

      <div ref={barRef} className="fixed inset-x-0 bottom-0 z-20 border-t-2 border-reed-800 bg-paper/95 p-3">
        <div className="mx-auto flex max-w-xl gap-2">
          <button
            type="button"
            onClick={onCancel}
            className="inline-flex min-h-[56px] items-center justify-center rounded-xl border-2 border-reed-700 bg-white px-5 text-lg font-semibold text-reed-800"
          >
            {t("cancel")}
          </button>
          <button
            type="submit"
            disabled={photoBusy}
            className="inline-flex min-h-[56px] flex-1 items-center justify-center rounded-xl bg-reed-700 px-5 text-lg font-bold text-paper disabled:opacity-60"
          >
            {cautions.length ? t("caution.saveAnyway") : answering ? t("sendAnswer") : t("save")}
          </button>
        </div>
      </div>
    </form>
  );
}
