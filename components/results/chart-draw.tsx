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
import type { CurvePoint } from "@/lib/diversity/index";
import type { ChartLabels } from "./results-charts";
import type { HillChartLabels, HillSeries, Row } from "./hill-charts";
import { GRID, TICK, zoneColour, zoneMarker } from "./chart-style";
import { curveRows, type CurveRow } from "./curve-rows";

// The drawings of the results charts (Recharts), loaded only when a chart comes near the
// screen: the figures, their captions and their data tables are in results-charts.tsx and
// hill-charts.tsx, rendered with the page.

/** A series' point marker (Recharts' own symbols), in its zone's colour and shape. */
function zoneDot(i: number) {
  function Dot(props: { cx?: number; cy?: number; index?: number }) {
    const { cx, cy } = props;
    if (cx === undefined || cy === undefined || !Number.isFinite(cx) || !Number.isFinite(cy)) return null;
    return <Symbols key={props.index} cx={cx} cy={cy} type={zoneMarker(i)} size={60} fill={zoneColour(i)} />;
  }
  return Dot;
}

export function CurveDraw({
  rows,
  observed,
  xLabel,
  labels,
}: {
  rows: CurveRow[];
  observed: CurvePoint | null;
  xLabel: string;
  labels: ChartLabels;
}) {
  return (
    <ResponsiveContainer width="100%" height="100%">
      <ComposedChart data={rows} margin={{ top: 8, right: 16, bottom: 24, left: 8 }}>
        <CartesianGrid stroke="#d5e8dc" />
        <XAxis
          dataKey="size"
          type="number"
          domain={[0, "dataMax"]}
          tick={TICK}
          label={{ value: xLabel, position: "insideBottom", offset: -12, fill: TICK.fill }}
        />
        <YAxis tick={TICK} label={{ value: labels.species, angle: -90, position: "insideLeft", fill: TICK.fill }} />
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
  );
}

export function RankDraw({ rows, labels }: { rows: { rank: number; abundance: number }[]; labels: ChartLabels }) {
  return (
    <ResponsiveContainer width="100%" height="100%">
      <LineChart data={rows} margin={{ top: 8, right: 16, bottom: 24, left: 8 }}>
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
        <Line dataKey="abundance" name={labels.abundance} stroke="#8f5a12" dot={{ r: 2 }} isAnimationActive={false} />
      </LineChart>
    </ResponsiveContainer>
  );
}

export function ZonesDraw({
  zones,
  labels,
}: {
  zones: { name: string; rarefaction: CurvePoint[] }[];
  labels: ChartLabels;
}) {
  return (
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
        <YAxis tick={TICK} label={{ value: labels.species, angle: -90, position: "insideLeft", fill: TICK.fill }} />
        <Tooltip />
        <Legend verticalAlign="top" />
        {zones.flatMap((z, i) => {
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
  );
}

function SeriesLines({
  series,
  bands,
  dashed,
  labels,
}: {
  series: HillSeries[];
  bands: boolean;
  dashed: boolean;
  labels: HillChartLabels;
}) {
  return (
    <>
      {bands
        ? series.map((s, i) => (
            <Area
              key={`b${i}`}
              dataKey={`s${i}b`}
              name={`${s.name} ${labels.bandSuffix}`}
              legendType="none"
              stroke="none"
              fill={zoneColour(i)}
              fillOpacity={0.12}
              connectNulls
              isAnimationActive={false}
            />
          ))
        : null}
      {series.map((s, i) => (
        <Line
          key={`r${i}`}
          dataKey={`s${i}r`}
          name={s.name}
          legendType={zoneMarker(i)}
          stroke={zoneColour(i)}
          strokeWidth={2}
          dot={zoneDot(i)}
          connectNulls
          isAnimationActive={false}
        />
      ))}
      {dashed
        ? series.map((s, i) => (
            <Line
              key={`e${i}`}
              dataKey={`s${i}e`}
              name={`${s.name} ${labels.extrapolatedSuffix}`}
              legendType="none"
              stroke={zoneColour(i)}
              strokeWidth={2}
              strokeDasharray="6 4"
              dot={zoneDot(i)}
              connectNulls
              isAnimationActive={false}
            />
          ))
        : null}
    </>
  );
}

export function HillDraw({
  data,
  xLabel,
  yLabel,
  domain,
  series,
  bands,
  dashed,
  labels,
}: {
  data: Row[];
  xLabel: string;
  yLabel: string;
  domain?: [number, number];
  series: HillSeries[];
  bands: boolean;
  dashed: boolean;
  labels: HillChartLabels;
}) {
  const axis = (x: string, y: string) => (
    <>
      <CartesianGrid stroke={GRID} />
      <XAxis
        dataKey="x"
        type="number"
        domain={domain ?? [0, "dataMax"]}
        tick={TICK}
        label={{ value: x, position: "insideBottom", offset: -12, fill: TICK.fill }}
      />
      <YAxis tick={TICK} label={{ value: y, angle: -90, position: "insideLeft", fill: TICK.fill }} />
      <Tooltip />
      <Legend verticalAlign="top" />
    </>
  );
  return (
    <ResponsiveContainer width="100%" height="100%">
      <ComposedChart data={data} margin={{ top: 8, right: 16, bottom: 24, left: 8 }}>
        {axis(xLabel, yLabel)}
        <SeriesLines series={series} bands={bands} dashed={dashed} labels={labels} />
      </ComposedChart>
    </ResponsiveContainer>
  );
}
