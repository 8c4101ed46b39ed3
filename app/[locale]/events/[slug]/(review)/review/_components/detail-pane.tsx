"use client";

import { useLocale, useTranslations } from "next-intl";
import type { CheckMark, ReviewState } from "@/lib/domain";
import { ReviewStateMark } from "@/components/state-mark";
import { MarkChips } from "./mark-chips";
import { regionalLocale } from "@/lib/time/regional";
import { RealMap } from "@/components/map/real-map";
import type { DetailResponse } from "./desk-api";

type Props = {
  detail: DetailResponse;
  timeZone: string;
  eventId: string;
  /** Undo the latest decision (any coordinator of the sighting's group, at any time). */
  onUndo?: (reviewId: number) => void;
  busy?: boolean;
};

// What a reviewer needs to judge one sighting. Times in the event's time zone (said above).
export function DetailPane({ detail, timeZone, eventId, onUndo, busy }: Props) {
  const t = useTranslations("ReviewDesk.detail");
  const tKind = useTranslations("ReviewDesk.sessionKinds");
  const tQueue = useTranslations("ReviewDesk.queue");
  const tState = useTranslations("StateMark.review");
  const tReason = useTranslations("ReviewDesk.reasons");
  // The reader's language written as the event's region writes it (en + Europe/London: en-GB).
  const locale = regionalLocale(useLocale(), timeZone);
  const s = detail.sighting;
  const dt = (v: string | Date, style: "short" | "medium" = "medium") =>
    new Intl.DateTimeFormat(locale, { dateStyle: style, timeStyle: "short", timeZone }).format(new Date(v));
  const time = (v: string | Date) =>
    new Intl.DateTimeFormat(locale, { timeStyle: "short", timeZone }).format(new Date(v));
  const num = new Intl.NumberFormat(locale, { maximumFractionDigits: 5 });
  const reasonText = (r: string) =>
    r in { misidentified: 1, duplicate: 1, outside_event: 1, insufficient_evidence: 1, other: 1 }
      ? tReason(r as "other")
      : r;

  return (
    <article aria-labelledby="detail-title" className="space-y-4">
      <header className="space-y-1">
        <h2 id="detail-title" className="text-xl font-bold text-reed-900">
          {s.commonName ?? s.scientificName ?? tQueue("unidentified")}
          {s.scientificName ? <i className="ms-2 font-normal text-ink-soft">{s.scientificName}</i> : null}
        </h2>
        <div className="flex flex-wrap items-center gap-2">
          <ReviewStateMark state={s.reviewState} />
          <span className="text-xs text-ink-soft">{t("version", { v: s.version })}</span>
        </div>
        <MarkChips marks={s.checkMarks as CheckMark[]} />
      </header>
      {s.sensitivity && s.sensitivity !== "open" ? (
        <p
          role="note"
          className="rounded border-2 border-heath-600 bg-heath-50 p-2 text-sm font-semibold text-heath-900"
        >
          {t("sensitive")}
        </p>
      ) : null}
      <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-1 text-sm">
        <dt className="font-semibold">{t("volunteer")}</dt>
        <dd>{s.volunteerName}</dd>
        <dt className="font-semibold">{t("count")}</dt>
        <dd>{s.countIsEstimate ? tQueue("about", { count: s.count }) : s.count}</dd>
        <dt className="font-semibold">{t("observed")}</dt>
        <dd>{dt(s.observedAt)}</dd>
        <dt className="font-semibold">{t("received")}</dt>
        <dd>{dt(s.receivedAt)}</dd>
        <dt className="font-semibold">{t("source")}</dt>
        <dd>
          {s.source === "paper_sheet"
            ? s.transcriberName
              ? t("transcribedBy", { name: s.transcriberName })
              : t("sourcePaper")
            : t("sourcePhone")}
        </dd>
        <dt className="font-semibold">{t("location")}</dt>
        <dd>
          {num.format(s.lat)}, {num.format(s.lon)} ({t("accuracy", { m: Math.round(s.accuracyM) })})
        </dd>
        <dt className="font-semibold">{t("zone")}</dt>
        <dd>{s.zoneName ?? t("noZone")}</dd>
        <dt className="font-semibold">{t("session")}</dt>
        <dd>
          {s.sessionId ? (
            <>
              {t("sessionLine", {
                kind: tKind((s.sessionKind ?? "walk") as "walk"),
                start: dt(s.sessionStartedAt!, "short"),
                end: s.sessionEndedAt ? time(s.sessionEndedAt) : t("sessionOpen"),
                zone: s.sessionZoneName ?? t("noZone"),
              })}
              <span className="block text-ink-soft">
                {s.sessionAllSpecies ? t("allSpecies") : t("notAllSpecies")} ·{" "}
                {t("sessionCount", { n: s.sessionSightings ?? 0 })}
              </span>
            </>
          ) : (
            t("noSession")
          )}
        </dd>
        {s.description ? (
          <>
            <dt className="font-semibold">{t("description")}</dt>
            <dd className="whitespace-pre-line">{s.description}</dd>
          </>
        ) : null}
        {s.notes ? (
          <>
            <dt className="font-semibold">{t("notes")}</dt>
            <dd className="whitespace-pre-line">{s.notes}</dd>
          </>
        ) : null}
      </dl>
      <figure className="space-y-1">
        <RealMap
          area={detail.map.area}
          zones={detail.map.zones}
          point={{ longitude: s.lon, latitude: s.lat, accuracyM: s.accuracyM }}
          zoneId={s.zoneId}
          focusPoint
          label={t("map")}
          className="h-64 w-full rounded-lg border border-reed-200"
        />
        <figcaption className="text-xs text-ink-soft">{t("mapLegend")}</figcaption>
      </figure>
      <section aria-labelledby="photos-title">
        <h3 id="photos-title" className="font-bold text-reed-900">
          {t("photos")}
        </h3>
        {detail.photos.length ? (
          <ul className="flex flex-wrap gap-2 text-sm">
            {detail.photos.map((p) => (
              <li key={p.id}>
                {/* The photo handler (GET /api/events/[eventId]/photos/[photoId]?size=thumb|full) checks the
                    reviewer's right and redirects to a short-lived link; full size only on demand. */}
                <a
                  href={`/api/events/${eventId}/photos/${p.id}?size=full`}
                  target="_blank"
                  rel="noopener"
                  className="block underline"
                >
                  {/* eslint-disable-next-line @next/next/no-img-element -- a redirect to a short-lived signed link; next/image would proxy and cache a private photo */}
                  <img
                    src={`/api/events/${eventId}/photos/${p.id}?size=thumb`}
                    alt={t("photoLine", { type: p.contentType, kb: Math.round(p.sizeBytes / 1024) })}
                    loading="lazy"
                    className="h-24 w-24 rounded border border-reed-200 object-cover"
                  />
                  <span className="sr-only">{t("photoFull")}</span>
                </a>
              </li>
            ))}
          </ul>
        ) : (
          <p className="text-sm">{t("noPhotos")}</p>
        )}
      </section>
      <section aria-labelledby="nearby-title">
        <h3 id="nearby-title" className="font-bold text-reed-900">
          {t("nearby")}
        </h3>
        {detail.nearby.length ? (
          <ul className="space-y-0.5 text-sm">
            {detail.nearby.map((n) => (
              <li key={n.id}>
                {t("nearbyLine", {
                  time: time(n.observedAt),
                  what: n.commonName ?? n.scientificName ?? tQueue("unidentified"),
                  count: n.count,
                  distance: n.distanceM,
                  state: tState(n.reviewState),
                })}
              </li>
            ))}
          </ul>
        ) : (
          <p className="text-sm">{t("noNearby")}</p>
        )}
      </section>
      <section aria-labelledby="history-title">
        <h3 id="history-title" className="font-bold text-reed-900">
          {t("history")}
        </h3>
        {detail.history.length ? (
          <ol className="space-y-1 text-sm">
            {detail.history.map((h, i) => (
              <li key={h.id} className="border-l-4 border-reed-300 pl-2">
                <span className="block text-ink-soft">{dt(h.decidedAt, "short")}</span>
                {h.undoesId ? <span className="block font-semibold">{t("undoRow")}</span> : null}
                {t("historyState", {
                  who: h.reviewerName,
                  from: tState(h.fromState as ReviewState),
                  to: tState(h.toState as ReviewState),
                })}
                {h.fromTaxon !== h.toTaxon ? (
                  <span className="block">{t("historyTaxon", { from: h.fromTaxon ?? "—", to: h.toTaxon ?? "—" })}</span>
                ) : null}
                {h.reason ? <span className="block">{t("reason", { reason: reasonText(h.reason) })}</span> : null}
                {h.message ? (
                  <span className="block whitespace-pre-line">{t("message", { message: h.message })}</span>
                ) : null}
                {onUndo && i === detail.history.length - 1 ? (
                  <button
                    type="button"
                    disabled={busy}
                    className="mt-1 inline-flex min-h-touch items-center rounded-lg border-2 border-reed-700 px-3 font-semibold text-reed-800 disabled:opacity-60"
                    onClick={() => onUndo(h.id)}
                  >
                    {t("undoHistory")}
                  </button>
                ) : null}
              </li>
            ))}
          </ol>
        ) : (
          <p className="text-sm">{t("noHistory")}</p>
        )}
      </section>
    </article>
  );
}
