import { useFormatter } from "next-intl";
import { useId } from "react";
import type { CurvePoint } from "@/lib/diversity/index";
import { ChartDataTable } from "./chart-style";
import { CurveChart, RankChart, ZonesChart } from "./chart-lazy";
import { curveRows } from "./curve-rows";

export type ChartLabels = {
  rarefactionTitle: string;
  accumulationTitle: string;
  rankTitle: string;
  zonesTitle: string;
  individuals: string;
  sessions: string;
  species: string;
  rank: string;
  abundance: string;
  observedPart: string;
  extrapolatedPart: string;
  band: string;
  observedPoint: string;
  noData: string;
  chartSummary: string;
  zonesSummary: string;
  dataTable: string;
  zone: string;
  part: string;
  lower: string;
  upper: string;
};

/** The numbers behind a chart, as its text alternative (the chart's figure points to it). */
function DataTable({
  id,
  labels,
  rows,
  xLabel,
  withZone,
}: {
  id: string;
  labels: ChartLabels;
  rows: { zone?: string; size: number; richness: number; lower?: number; upper?: number; part: string }[];
  xLabel: string;
  withZone?: boolean;
}) {
  const format = useFormatter();
  const n = (v: number | undefined) => (v === undefined ? "" : format.number(v, { maximumFractionDigits: 1 }));
  return (
    <ChartDataTable
      id={id}
      summary={labels.dataTable}
      headers={[...(withZone ? [labels.zone] : []), xLabel, labels.species, labels.lower, labels.upper, labels.part]}
      rows={rows.map((r, i) => ({
        key: String(i),
        cells: [...(withZone ? [r.zone ?? ""] : []), n(r.size), n(r.richness), n(r.lower), n(r.upper), r.part],
      }))}
    />
  );
}

const partOf = (p: CurvePoint, labels: ChartLabels) =>
  p.kind === "extrapolated"
    ? labels.extrapolatedPart
    : p.kind === "observed"
      ? labels.observedPoint
      : labels.observedPart;

function Curve({
  points,
  title,
  xLabel,
  labels,
  empty,
}: {
  points: CurvePoint[];
  title: string;
  xLabel: string;
  labels: ChartLabels;
  empty?: string;
}) {
  const observed = points.find((p) => p.kind === "observed");
  const tableId = useId();
  return (
    <figure className="rounded-lg border border-reed-200 bg-white/70 p-3" aria-label={title}>
      <figcaption className="font-semibold">{title}</figcaption>
      {points.length === 0 ? (
        <p>{empty || labels.noData}</p>
      ) : (
        <>
          <div
            className="h-72 w-full"
            dir="ltr"
            role="img"
            aria-label={`${title}. ${labels.chartSummary}`}
            aria-describedby={tableId}
          >
            <CurveChart rows={curveRows(points)} observed={observed ?? null} xLabel={xLabel} labels={labels} />
          </div>
          <DataTable
            id={tableId}
            labels={labels}
            xLabel={xLabel}
            rows={points.map((p) => ({ ...p, part: partOf(p, labels) }))}
          />
        </>
      )}
    </figure>
  );
}

export function ResultsCharts(props: {
  rarefaction: CurvePoint[];
  accumulation: CurvePoint[];
  ranks: number[];
  zones: { name: string; rarefaction: CurvePoint[] }[];
  labels: ChartLabels;
  /** Why a curve is not drawn although there are records (too few records, counts not of individuals). */
  rarefactionNote?: string;
  accumulationNote?: string;
}) {
  const { labels } = props;
  const rankRows = props.ranks.map((v, i) => ({ rank: i + 1, abundance: v }));
  const rankTable = useId();
  const zonesTable = useId();
  return (
    <div className="grid gap-4 lg:grid-cols-2" data-testid="results-charts">
      <Curve
        points={props.rarefaction}
        title={labels.rarefactionTitle}
        xLabel={labels.individuals}
        labels={labels}
        empty={props.rarefactionNote}
      />
      <Curve
        points={props.accumulation}
        title={labels.accumulationTitle}
        xLabel={labels.sessions}
        labels={labels}
        empty={props.accumulationNote}
      />
      <figure className="rounded-lg border border-reed-200 bg-white/70 p-3" aria-label={labels.rankTitle}>
        <figcaption className="font-semibold">{labels.rankTitle}</figcaption>
        <div className="h-72 w-full" dir="ltr" role="img" aria-label={labels.rankTitle} aria-describedby={rankTable}>
          <RankChart rows={rankRows} labels={labels} />
        </div>
        <DataTable
          id={rankTable}
          labels={{ ...labels, species: labels.abundance }}
          xLabel={labels.rank}
          rows={rankRows.map((r) => ({ size: r.rank, richness: r.abundance, part: labels.observedPart }))}
        />
      </figure>
      <figure className="rounded-lg border border-reed-200 bg-white/70 p-3" aria-label={labels.zonesTitle}>
        <figcaption className="font-semibold">{labels.zonesTitle}</figcaption>
        <div
          className="h-72 w-full"
          dir="ltr"
          role="img"
          aria-label={`${labels.zonesTitle}. ${labels.zonesSummary}`}
          aria-describedby={zonesTable}
        >
          <ZonesChart zones={props.zones} labels={labels} />
        </div>
        <DataTable
          id={zonesTable}
          labels={labels}
          xLabel={labels.individuals}
          withZone
          rows={props.zones.flatMap((z) => z.rarefaction.map((p) => ({ ...p, zone: z.name, part: partOf(p, labels) })))}
        />
      </figure>
    </div>
  );
}
