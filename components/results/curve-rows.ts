import type { CurvePoint } from "@/lib/diversity/index";

/** A rarefaction/extrapolation curve as the charts draw it: the two parts as separate series, the band as a range. */
export type CurveRow = {
  size: number;
  interpolated: number | null;
  extrapolated: number | null;
  band: [number, number];
};

export function curveRows(points: CurvePoint[]): CurveRow[] {
  return points.map((p) => ({
    size: p.size,
    interpolated: p.kind !== "extrapolated" ? p.richness : null,
    extrapolated: p.kind !== "rarefied" ? p.richness : null,
    band: [p.lower, p.upper] as [number, number],
  }));
}
