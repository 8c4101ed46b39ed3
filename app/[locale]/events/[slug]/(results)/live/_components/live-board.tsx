"use client";

import useSWR from "swr";
import { ReviewStateMark } from "@/components/state-mark";
import type { LiveFigures } from "@/db/queries/results";
import { fetcher } from "@/lib/http/client";
import { Bar, BarChart, CartesianGrid, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import type { BlockLead, LiveBeside, LiveCompleteness } from "@/lib/results/live";
import type { Reason } from "@/lib/results/compute";

// The live handler's answer (app/api/events/[eventId]/live), dates as JSON strings.
type Live = LiveFigures & { completeness: LiveCompleteness; beside: LiveBeside; at: string };

export type LiveLabels = Record<
  | "perHour"
  | "volunteers"
  | "lastHour"
  | "today"
  | "total"
  | "backlog"
  | "completeness"
  | "share"
  | "coverage"
  | "nextTitle"
  | "nextIntro"
  | "nextAccess"
  | "zoneLine"
  | "unsampled"
  | "loading"
  | "failed"
  | "updated"
  | "hour"
  | "sightings"
  | "completenessNote"
  | "coverageSample"
  | "coverageIncidence"
  | "tooFew"
  | "eventTooFew"
  | "pendingBody"
  | "besideTitle"
  | "besideNone"
  | "besideStandard"
  | "besideRow"
  | "besideTooFew"
  | "besideAsOf"
  | "verdict.more"
  | "verdict.fewer"
  | "verdict.noClearDifference"
  | "kind.abundance"
  | "kind.incidence"
  | "reason.countUnits"
  | "reason.individuals"
  | "reason.coverage"
  | "reason.sessions"
  | "reason.incidenceCoverage",
  string
>;

const fill = (s: string, v: Record<string, string | number>) =>
  s.replace(/\{(\w+)\}/g, (_, k: string) => String(v[k] ?? ""));

/** The live board: refreshed every 15 s while the page is open (SWR polling). */
export function LiveBoard({
  eventId,
  labels,
  locale,
  timeZone,
}: {
  eventId: string;
  labels: LiveLabels;
  locale: string;
  timeZone: string;
}) {
  const { data, error } = useSWR<Live>(`/api/events/${eventId}/live`, fetcher, { refreshInterval: 15_000 });
  const pct = (v: number) => new Intl.NumberFormat(locale, { style: "percent", maximumFractionDigits: 1 }).format(v);
  const num = (v: number) => new Intl.NumberFormat(locale, { maximumFractionDigits: 1 }).format(v);
  const hourOf = (iso: string) =>
    new Intl.DateTimeFormat(locale, { month: "short", day: "numeric", hour: "numeric", timeZone }).format(
      new Date(iso),
    );
  if (error) return <p role="alert">{labels.failed}</p>;
  if (!data) return <p role="status">{labels.loading}</p>;
  const c = data.completeness;
  const ev = c.event;
  // Reason texts come with their thresholds filled on the server; count units named there too.
  const whyOf = (reasons: Reason[]) => reasons.map((r) => labels[`reason.${r}`]).join("; ");
  const why = (b: BlockLead) => whyOf(b.reasons);
  const monthOf = (iso: string) =>
    new Intl.DateTimeFormat(locale, { year: "numeric", month: "long", timeZone }).format(new Date(iso));
  const coverageLabel = (b: BlockLead) =>
    b.coverageKind === "incidence" ? labels.coverageIncidence : labels.coverageSample;
  return (
    <div className="space-y-6" data-testid="live-board">
      <p className="text-sm text-ink-soft" role="status">
        {fill(labels.updated, {
          time: new Intl.DateTimeFormat(locale, { timeStyle: "medium", timeZone }).format(new Date(data.at)),
        })}
      </p>
      <div className="grid gap-4 md:grid-cols-3">
        <section className="rounded-lg border border-reed-200 bg-white/70 p-3" aria-label={labels.volunteers}>
          <h2 className="font-bold">{labels.volunteers}</h2>
          <p>
            {labels.lastHour}: <b>{num(data.activeVolunteers.lastHour)}</b>
          </p>
          <p>
            {labels.today}: <b>{num(data.activeVolunteers.today)}</b>
          </p>
          <p>
            {labels.total}: <b>{num(data.activeVolunteers.total)}</b>
          </p>
        </section>
        <section className="rounded-lg border border-reed-200 bg-white/70 p-3" aria-label={labels.backlog}>
          <h2 className="font-bold">{labels.backlog}</h2>
          <ul className="space-y-1">
            {(["pending", "returned", "approved", "rejected"] as const).map((s) => (
              <li key={s}>
                <ReviewStateMark state={s} />: <b>{num(data.backlog[s])}</b>
              </li>
            ))}
          </ul>
        </section>
        <section className="rounded-lg border border-reed-200 bg-white/70 p-3" aria-label={labels.completeness}>
          <h2 className="font-bold">{labels.completeness}</h2>
          {ev.richness ? (
            <p>
              {fill(labels.share, {
                observed: ev.observed,
                estimate: num(ev.richness.estimate),
                estimator: ev.richness.estimator === "chao1" ? "Chao1" : "Chao2",
                lower: num(ev.richness.lower),
                upper: num(ev.richness.upper),
                share: pct(ev.completeness ?? 0),
              })}
            </p>
          ) : (
            <p>{fill(labels.eventTooFew, { reasons: why(ev) })}</p>
          )}
          {ev.coverage !== null ? (
            <p>
              {coverageLabel(ev)}: <b>{pct(ev.coverage)}</b>
            </p>
          ) : null}
          <p className="text-sm text-ink-soft">{labels.completenessNote}</p>
          {c.pending && c.pending.pending + c.pending.returned > 0 ? (
            <p className="text-sm" data-testid="live-pending">
              {fill(labels.pendingBody, {
                pending: num(c.pending.pending),
                returned: num(c.pending.returned),
                pendingComplete: num(c.pending.pendingInCompleteSessions),
                returnedComplete: num(c.pending.returnedInCompleteSessions),
              })}
            </p>
          ) : null}
        </section>
      </div>
      <BesideEarlier
        data={data}
        labels={labels}
        pct={pct}
        num={num}
        monthOf={monthOf}
        whyOf={whyOf}
        timeZone={timeZone}
        locale={locale}
      />
      <section className="rounded-lg border border-reed-200 bg-white/70 p-3" aria-label={labels.perHour}>
        <h2 className="font-bold">{labels.perHour}</h2>
        <div className="h-56 w-full" dir="ltr">
          <ResponsiveContainer width="100%" height="100%">
            <BarChart data={data.perHour.map((h) => ({ hour: hourOf(h.hour), sightings: h.sightings }))}>
              <CartesianGrid stroke="#d5e8dc" />
              <XAxis dataKey="hour" tick={{ fill: "#2b3a31" }} />
              <YAxis allowDecimals={false} tick={{ fill: "#2b3a31" }} />
              <Tooltip />
              <Bar dataKey="sightings" name={labels.sightings} fill="#225c41" isAnimationActive={false} />
            </BarChart>
          </ResponsiveContainer>
        </div>
      </section>
      <section aria-labelledby="next-title" className="space-y-2">
        <h2 id="next-title" className="text-xl font-bold text-reed-900">
          {labels.nextTitle}
        </h2>
        <p>{labels.nextIntro}</p>
        <p role="note" className="rounded-lg border-2 border-heath-600 bg-heath-50 p-2 text-heath-900">
          <span aria-hidden="true">⚠ </span>
          {labels.nextAccess}
        </p>
        <ol className="list-decimal space-y-1 ps-5" data-testid="where-next">
          {c.zones.map((z) => (
            <li key={z.id}>
              <b>{z.name}</b>:{" "}
              {z.individuals === 0
                ? labels.unsampled
                : z.tooFew || z.coverage === null
                  ? fill(labels.tooFew, { reasons: why(z) })
                  : fill(labels.zoneLine, {
                      coverageName: coverageLabel(z),
                      coverage: pct(z.coverage),
                      undetected: num(z.undetected ?? 0),
                      observed: z.observed,
                    })}
            </li>
          ))}
        </ol>
      </section>
    </div>
  );
}

/**
 * The running event beside the newest earlier event of its site: richness at equal coverage
 * (the standard named with its value) and the results page's verdict sentence ("more" or
 * "fewer" only when the bootstrap interval of the difference excludes 0).
 */
function BesideEarlier({
  data,
  labels,
  pct,
  num,
  monthOf,
  whyOf,
  timeZone,
  locale,
}: {
  data: Live;
  labels: LiveLabels;
  pct: (v: number) => string;
  num: (v: number) => string;
  monthOf: (iso: string) => string;
  whyOf: (reasons: Reason[]) => string;
  timeZone: string;
  locale: string;
}) {
  const b = data.beside;
  const c = b?.comparison;
  const [now, then] = c?.events ?? [];
  return (
    <section
      className="space-y-1 rounded-lg border border-reed-200 bg-white/70 p-3"
      aria-label={labels.besideTitle}
      data-testid="live-beside"
    >
      <h2 className="font-bold">{labels.besideTitle}</h2>
      {!b || !c || !now || !then ? (
        <p>{labels.besideNone}</p>
      ) : (
        <>
          <p className="text-sm">
            {labels[c.kind === "abundance" ? "kind.abundance" : "kind.incidence"]}{" "}
            {c.coverage > 0 ? fill(labels.besideStandard, { coverage: pct(c.coverage) }) : null}
          </p>
          <ul className="list-disc ps-5">
            {c.events.map((e) => {
              const left = c.leftOut.find((x) => x.id === e.id);
              return (
                <li key={e.id}>
                  {e.atCoverage && !left
                    ? fill(labels.besideRow, {
                        event: e.name,
                        date: monthOf(e.startsAt),
                        richness: num(e.atCoverage.richness),
                        lower: num(e.atCoverage.lower),
                        upper: num(e.atCoverage.upper),
                        observed: num(e.observed),
                      })
                    : fill(labels.besideTooFew, {
                        event: e.name,
                        date: monthOf(e.startsAt),
                        reasons: whyOf(left?.reasons ?? []),
                      })}
                </li>
              );
            })}
          </ul>
          {c.sentence ? (
            <p data-testid="live-beside-sentence">
              {fill(labels[`verdict.${c.sentence.verdict}`], {
                a: now.name,
                b: then.name,
                coverage: pct(c.coverage),
                difference: num(Math.abs(c.sentence.difference)),
                lower: num(c.sentence.lower),
                upper: num(c.sentence.upper),
                replicates: c.replicates,
              })}
            </p>
          ) : null}
          <p className="text-sm text-ink-soft">
            {fill(labels.besideAsOf, {
              time: new Intl.DateTimeFormat(locale, { timeStyle: "short", timeZone }).format(new Date(b.at)),
            })}
          </p>
        </>
      )}
    </section>
  );
}
