"use client";

import useSWR from "swr";
import { ReviewStateMark } from "@/components/state-mark";
import type { LiveFigures } from "@/db/queries/results";
import { fetcher } from "@/lib/http/client";
import { Bar, BarChart, CartesianGrid, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import type { BlockLead, LiveCompleteness } from "@/lib/results/live";

// The live handler's answer (app/api/events/[eventId]/live), dates as JSON strings.
type Live = LiveFigures & { completeness: LiveCompleteness; at: string };

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
  | "pendingLine"
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
  const why = (b: BlockLead) => b.reasons.map((r) => labels[`reason.${r}`]).join("; ");
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
            <p className="text-sm">
              {fill(labels.pendingLine, { pending: c.pending.pending, returned: c.pending.returned })}
            </p>
          ) : null}
        </section>
      </div>
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
