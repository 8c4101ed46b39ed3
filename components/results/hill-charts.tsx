import { useFormatter } from "next-intl";
import type { HillBlock } from "@/lib/results/compute";
import { ChartDataTable } from "./chart-style";
import { HillChart } from "./chart-lazy";

export type HillChartLabels = {
  curveTitle: string[]; // q = 0, 1, 2
  completenessTitle: string;
  profileTitle: string;
  size: string;
  hill: string;
  coverage: string;
  order: string;
  estimate: string;
  observed: string;
  lower: string;
  upper: string;
  part: string;
  parts: Record<HillBlock["curve"][number]["part"], string>;
  extrapolatedSuffix: string;
  bandSuffix: string;
  table: string;
  summary: string;
  zone: string;
  noBands: string;
};

export type HillSeries = { name: string; hill: HillBlock };

export type Row = Record<string, number | [number, number] | null>;

/** Rows keyed by x, one set of columns per series (s{i}r rarefied, s{i}e extrapolated, s{i}b band). */
function merge(
  series: HillSeries[],
  pick: (
    h: HillBlock,
  ) => { x: number; y: number; band: [number, number] | null; extrapolated: boolean; observed: boolean }[],
): Row[] {
  const rows = new Map<number, Row>();
  series.forEach((s, i) => {
    for (const p of pick(s.hill)) {
      const row = rows.get(p.x) ?? { x: p.x };
      if (!p.extrapolated || p.observed) row[`s${i}r`] = p.y;
      if (p.extrapolated || p.observed) row[`s${i}e`] = p.y;
      if (p.band) row[`s${i}b`] = p.band;
      rows.set(p.x, row);
    }
  });
  return [...rows.values()].sort((a, b) => (a.x as number) - (b.x as number));
}

function Frame({
  title,
  summary,
  children,
  table,
}: {
  title: string;
  summary: string;
  children: React.ReactNode;
  table: React.ReactNode;
}) {
  return (
    <figure className="rounded-lg border border-reed-200 bg-white/70 p-3" aria-label={title}>
      <figcaption className="font-semibold">{title}</figcaption>
      <div className="h-72 w-full" role="img" aria-label={`${title}. ${summary}`}>
        {children}
      </div>
      {table}
    </figure>
  );
}

/**
 * Hill numbers q = 0, 1, 2 along sample size (solid: rarefied, dashed: extrapolated, shaded:
 * bootstrap 95% band), the sample-completeness curve and the asymptotic profile over q,
 * one series per block (whole event, then each zone), each chart with its table.
 */
export function HillCharts({
  series,
  labels,
  xLabel,
}: {
  series: HillSeries[];
  labels: HillChartLabels;
  xLabel: string;
}) {
  const format = useFormatter();
  const fmt = (v: number, digits = 2) =>
    Number.isFinite(v) ? format.number(v, { maximumFractionDigits: digits }) : "∞";
  const bands = series.some((s) => s.hill.curve.some((r) => r.replicates > 0));
  const curvePoints = (q: number) => (h: HillBlock) =>
    h.curve
      .filter((r) => r.order === q)
      .map((r) => ({
        x: r.size,
        y: r.estimate,
        band: r.replicates > 0 ? ([r.lower, r.upper] as [number, number]) : null,
        extrapolated: r.part === "extrapolated",
        observed: r.part === "observed",
      }));
  const coveragePoints = (h: HillBlock) =>
    h.curve
      .filter((r) => r.order === 0)
      .map((r) => ({
        x: r.size,
        y: r.coverage,
        band: null,
        extrapolated: r.part === "extrapolated",
        observed: r.part === "observed",
      }));
  const profilePoints = (h: HillBlock) =>
    h.profile.map((r) => ({
      x: r.order,
      y: r.estimate,
      band: r.replicates > 0 && Number.isFinite(r.upper) ? ([r.lower, r.upper] as [number, number]) : null,
      extrapolated: false,
      observed: false,
    }));
  const curveTable = (q: number) => (
    <ChartDataTable
      summary={labels.table}
      headers={[labels.zone, xLabel, labels.part, labels.estimate, labels.lower, labels.upper, labels.coverage]}
      rows={series.flatMap((s) =>
        s.hill.curve
          .filter((r) => r.order === q)
          .map((r) => ({
            key: `${s.name}-${r.size}`,
            rowHeader: true,
            cells: [
              s.name,
              fmt(r.size, 0),
              labels.parts[r.part],
              fmt(r.estimate),
              r.replicates > 0 ? fmt(r.lower) : "—",
              r.replicates > 0 ? fmt(r.upper) : "—",
              fmt(r.coverage, 3),
            ],
          })),
      )}
    />
  );
  return (
    <div className="space-y-3" data-testid="hill-charts">
      {!bands ? <p className="text-sm">{labels.noBands}</p> : null}
      <div className="grid gap-4 lg:grid-cols-2">
        {[0, 1, 2].map((q) => (
          <Frame key={q} title={labels.curveTitle[q]!} summary={labels.summary} table={curveTable(q)}>
            <HillChart
              data={merge(series, curvePoints(q))}
              xLabel={xLabel}
              yLabel={labels.hill}
              series={series}
              bands={bands}
              dashed
              labels={labels}
            />
          </Frame>
        ))}
        <Frame title={labels.completenessTitle} summary={labels.summary} table={curveTable(0)}>
          <HillChart
            data={merge(series, coveragePoints)}
            xLabel={xLabel}
            yLabel={labels.coverage}
            series={series}
            bands={false}
            dashed
            labels={labels}
          />
        </Frame>
        <Frame
          title={labels.profileTitle}
          summary={labels.summary}
          table={
            <ChartDataTable
              summary={labels.table}
              headers={[labels.zone, labels.order, labels.observed, labels.estimate, labels.lower, labels.upper]}
              rows={series.flatMap((s) =>
                s.hill.profile.map((r) => ({
                  key: `${s.name}-${r.order}`,
                  rowHeader: true,
                  cells: [
                    s.name,
                    fmt(r.order),
                    fmt(r.observed),
                    fmt(r.estimate),
                    r.replicates > 0 ? fmt(r.lower) : "—",
                    r.replicates > 0 ? fmt(r.upper) : "—",
                  ],
                })),
              )}
            />
          }
        >
          <HillChart
            data={merge(series, profilePoints)}
            xLabel={labels.order}
            yLabel={labels.hill}
            domain={[0, 2]}
            series={series}
            bands={bands}
            dashed={false}
            labels={labels}
          />
        </Frame>
      </div>
    </div>
  );
}
