"use client";

import {
  Area,
  CartesianGrid,
  ComposedChart,
  Legend,
  Line,
  LineChart,
  ReferenceDot,
  ResponsiveContainer,
  Symbols,
  Tooltip,
  XAxis,
  YAxis,
} from "recharts";
import { useFormatter } from "next-intl";
import { useId } from "react";
import type { CurvePoint } from "@/lib/diversity/index";
import { ChartDataTable, TICK, zoneColour, zoneMarker } from "./chart-style";

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

function curveRows(points: CurvePoint[]) {
  return points.map((p) => ({
    size: p.size,
    interpolated: p.kind !== "extrapolated" ? p.richness : null,
    extrapolated: p.kind !== "rarefied" ? p.richness : null,
    band: [p.lower, p.upper] as [number, number],
  }));
}

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
            <ResponsiveContainer width="100%" height="100%">
              <ComposedChart data={curveRows(points)} margin={{ top: 8, right: 16, bottom: 24, left: 8 }}>
                <CartesianGrid stroke="#d5e8dc" />
                <XAxis
                  dataKey="size"
                  type="number"
                  domain={[0, "dataMax"]}
                  tick={TICK}
                  label={{ value: xLabel, position: "insideBottom", offset: -12, fill: TICK.fill }}
                />
                <YAxis
                  tick={TICK}
                  label={{ value: labels.species, angle: -90, position: "insideLeft", fill: TICK.fill }}
                />
                <Tooltip />
                <Legend verticalAlign="top" />
                <Area
                  dataKey="band"
                  name={labels.band}
                  stroke="none"
                  fill="#76b08f"
                  fillOpacity={0.3}
                  isAnimationActive={false}
                />
                <Line
                  dataKey="interpolated"
                  name={labels.observedPart}
                  stroke="#153a2a"
                  strokeWidth={2}
                  dot={false}
                  isAnimationActive={false}
                  connectNulls={false}
                />
                <Line
                  dataKey="extrapolated"
                  name={labels.extrapolatedPart}
                  stroke="#153a2a"
                  strokeWidth={2}
                  strokeDasharray="6 4"
                  dot={false}
                  isAnimationActive={false}
                  connectNulls={false}
                />
                {observed ? (
                  <ReferenceDot
                    x={observed.size}
                    y={observed.richness}
                    r={6}
                    fill="#b5761c"
                    stroke="#0f2a1f"
                    label={{ value: labels.observedPoint, position: "top", fill: TICK.fill }}
                  />
                ) : null}
              </ComposedChart>
            </ResponsiveContainer>
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
          <ResponsiveContainer width="100%" height="100%">
            <LineChart data={rankRows} margin={{ top: 8, right: 16, bottom: 24, left: 8 }}>
              <CartesianGrid stroke="#d5e8dc" />
              <XAxis
                dataKey="rank"
                type="number"
                domain={[1, "dataMax"]}
                tick={TICK}
                label={{ value: labels.rank, position: "insideBottom", offset: -12, fill: TICK.fill }}
              />
              <YAxis
                scale="log"
                domain={[1, "auto"]}
                allowDataOverflow
                tick={TICK}
                label={{ value: labels.abundance, angle: -90, position: "insideLeft", fill: TICK.fill }}
              />
              <Tooltip />
              <Line
                dataKey="abundance"
                name={labels.abundance}
                stroke="#8f5a12"
                dot={{ r: 2 }}
                isAnimationActive={false}
              />
            </LineChart>
          </ResponsiveContainer>
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
          <ResponsiveContainer width="100%" height="100%">
            <LineChart margin={{ top: 8, right: 16, bottom: 24, left: 8 }}>
              <CartesianGrid stroke="#d5e8dc" />
              <XAxis
                dataKey="size"
                type="number"
                domain={[0, "dataMax"]}
                allowDuplicatedCategory={false}
                tick={TICK}
                label={{ value: labels.individuals, position: "insideBottom", offset: -12, fill: TICK.fill }}
              />
              <YAxis
                tick={TICK}
                label={{ value: labels.species, angle: -90, position: "insideLeft", fill: TICK.fill }}
              />
              <Tooltip />
              <Legend verticalAlign="top" />
              {props.zones.flatMap((z, i) => {
                const colour = zoneColour(i);
                const marker = zoneMarker(i);
                const rows = curveRows(z.rarefaction);
                const observedSize = z.rarefaction.find((p) => p.kind === "observed")?.size;
                // The zone's marker at its observed sample (where the solid part ends and the dashed part starts).
                const dot = (d: { cx?: number; cy?: number; payload?: { size: number }; index?: number }) =>
                  d.payload?.size === observedSize && d.cx !== undefined && d.cy !== undefined ? (
                    <Symbols key={`${z.name}-${d.index}`} cx={d.cx} cy={d.cy} type={marker} size={90} fill={colour} />
                  ) : (
                    <g key={`${z.name}-${d.index}`} />
                  );
                return [
                  <Line
                    key={`${z.name}-rarefied`}
                    data={rows}
                    dataKey="interpolated"
                    name={z.name}
                    stroke={colour}
                    strokeWidth={2}
                    legendType={marker}
                    dot={dot}
                    activeDot={false}
                    isAnimationActive={false}
                    connectNulls={false}
                  />,
                  <Line
                    key={`${z.name}-extrapolated`}
                    data={rows}
                    dataKey="extrapolated"
                    name={`${z.name} (${labels.extrapolatedPart})`}
                    stroke={colour}
                    strokeWidth={2}
                    strokeDasharray="6 4"
                    legendType="none"
                    dot={false}
                    isAnimationActive={false}
                    connectNulls={false}
                  />,
                ];
              })}
            </LineChart>
          </ResponsiveContainer>
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
