// One look for every results chart. Zones are told apart by colour and by marker shape,
// never by dashes (a dashed line means extrapolation on every chart), so a zone has the
// same colour and marker in every chart and the charts read in grey too. Colours at least
// 3:1 against white for lines (WCAG 1.4.11).
export const ZONE_COLOURS = ["#225c41", "#9a5d0f", "#3f62a0", "#8f3f71", "#3d463f", "#b0362a", "#2f7f7a"];
export const ZONE_MARKERS = ["circle", "square", "triangle", "diamond", "cross", "star", "wye"] as const;
export const zoneColour = (i: number) => ZONE_COLOURS[i % ZONE_COLOURS.length]!;
export const zoneMarker = (i: number) => ZONE_MARKERS[i % ZONE_MARKERS.length]!;
// Axis ticks and labels darker than Recharts' default grey so chart text reaches 4.5:1 on the card.
export const TICK = { fill: "#2b3a31" };
export const GRID = "#d5e8dc";

export { ChartDataTable } from "./chart-data-table";
