"use client";

import dynamic from "next/dynamic";
import type { ComponentProps } from "react";
import { WhenShown } from "@/components/ui/when-shown";
import type * as Draw from "./chart-draw";

// The results charts' drawings (Recharts), fetched and drawn only when a chart comes near the
// screen; the figures, captions and data tables around them are server-rendered HTML
// (results-charts.tsx, hill-charts.tsx), which the browser never hydrates (issue 18).
const CurveDraw = dynamic(() => import("./chart-draw").then((m) => m.CurveDraw), { ssr: false });
const RankDraw = dynamic(() => import("./chart-draw").then((m) => m.RankDraw), { ssr: false });
const ZonesDraw = dynamic(() => import("./chart-draw").then((m) => m.ZonesDraw), { ssr: false });
const HillDraw = dynamic(() => import("./chart-draw").then((m) => m.HillDraw), { ssr: false });

export function CurveChart(props: ComponentProps<typeof Draw.CurveDraw>) {
  return (
    <WhenShown>
      <CurveDraw {...props} />
    </WhenShown>
  );
}

export function RankChart(props: ComponentProps<typeof Draw.RankDraw>) {
  return (
    <WhenShown>
      <RankDraw {...props} />
    </WhenShown>
  );
}

export function ZonesChart(props: ComponentProps<typeof Draw.ZonesDraw>) {
  return (
    <WhenShown>
      <ZonesDraw {...props} />
    </WhenShown>
  );
}

export function HillChart(props: ComponentProps<typeof Draw.HillDraw>) {
  return (
    <WhenShown>
      <HillDraw {...props} />
    </WhenShown>
  );
}
