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
  Tooltip,
  XAxis,
  YAxis,
} from "recharts";
import type { CurvePoint } from "@/lib/diversity/index";

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
};

const ZONE_COLOURS = ["#225c41", "#b5761c", "#4a6fa5", "#8f3f71", "#3d463f", "#6e450f"];

function curveRows(points: CurvePoint[]) {
  return points.map((p) => ({
    size: p.size,
    interpolated: p.kind !== "extrapolated" ? p.richness : null,
    extrapolated: p.kind !== "rarefied" ? p.richness : null,
    band: [p.lower, p.upper] as [number, number],
  }));
}

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
  return (
    <figure className="rounded-lg border border-reed-200 bg-white/70 p-3" aria-label={title}>
      <figcaption className="font-semibold">{title}</figcaption>
      {points.length === 0 ? (
        <p>{empty || labels.noData}</p>
      ) : (
        <div className="h-72 w-full" role="img" aria-label={`${title}. ${labels.chartSummary}`}>
          <ResponsiveContainer width="100%" height="100%">
            <ComposedChart data={curveRows(points)} margin={{ top: 8, right: 16, bottom: 24, left: 8 }}>
              <CartesianGrid stroke="#d5e8dc" />
              <XAxis
                dataKey="size"
                type="number"
                domain={[0, "dataMax"]}
                label={{ value: xLabel, position: "insideBottom", offset: -12 }}
              />
              <YAxis label={{ value: labels.species, angle: -90, position: "insideLeft" }} />
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
                  label={{ value: labels.observedPoint, position: "top" }}
                />
              ) : null}
            </ComposedChart>
          </ResponsiveContainer>
        </div>
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
        <div className="h-72 w-full" role="img" aria-label={labels.rankTitle}>
          <ResponsiveContainer width="100%" height="100%">
            <LineChart data={rankRows} margin={{ top: 8, right: 16, bottom: 24, left: 8 }}>
              <CartesianGrid stroke="#d5e8dc" />
              <XAxis
                dataKey="rank"
                type="number"
                domain={[1, "dataMax"]}
                label={{ value: labels.rank, position: "insideBottom", offset: -12 }}
              />
              <YAxis
                scale="log"
                domain={[1, "auto"]}
                allowDataOverflow
                label={{ value: labels.abundance, angle: -90, position: "insideLeft" }}
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
      </figure>
      <figure className="rounded-lg border border-reed-200 bg-white/70 p-3" aria-label={labels.zonesTitle}>
        <figcaption className="font-semibold">{labels.zonesTitle}</figcaption>
        <div className="h-72 w-full" role="img" aria-label={labels.zonesTitle}>
          <ResponsiveContainer width="100%" height="100%">
            <LineChart margin={{ top: 8, right: 16, bottom: 24, left: 8 }}>
              <CartesianGrid stroke="#d5e8dc" />
              <XAxis
                dataKey="size"
                type="number"
                domain={[0, "dataMax"]}
                allowDuplicatedCategory={false}
                label={{ value: labels.individuals, position: "insideBottom", offset: -12 }}
              />
              <YAxis label={{ value: labels.species, angle: -90, position: "insideLeft" }} />
              <Tooltip />
              <Legend verticalAlign="top" />
              {props.zones.map((z, i) => (
                <Line
                  key={z.name}
                  data={z.rarefaction.map((p) => ({ size: p.size, richness: p.richness }))}
                  dataKey="richness"
                  name={z.name}
                  stroke={ZONE_COLOURS[i % ZONE_COLOURS.length]}
                  strokeWidth={2}
                  dot={false}
                  isAnimationActive={false}
                  strokeDasharray={i % 2 ? "8 3" : undefined}
                />
              ))}
            </LineChart>
          </ResponsiveContainer>
        </div>
      </figure>
    </div>
  );
}
