import type { ArealGeometry, PolygonGeometry } from "@/lib/geo/areal";

// What the maps draw, in [longitude, latitude] degrees (WGS84).
export type MapZone = { id: string; name: string; geometry: ArealGeometry };
export type MapPoint = { longitude: number; latitude: number; accuracyM?: number };
/** A record on the map: a dot with a name (a sighting). */
export type MapMarker = MapPoint & { id: string; label: string };
/** A generalised cell: where a sensitive record is, to the cell only. */
export type MapCell = { id: string; label: string; geometry: PolygonGeometry };
export type PlacedPoint = { longitude: number; latitude: number; accuracyM: number };

export type RealMapProps = {
  /** The accessible name of the map (translated). */
  label: string;
  area?: ArealGeometry | null;
  zones: MapZone[];
  /** The zone of the shown record: drawn with a solid, thicker outline. */
  zoneId?: string | null;
  /** The record or the placed point (red dot and its accuracy circle). */
  point?: MapPoint | null;
  /** The phone's own position (blue dot and its accuracy circle). */
  here?: MapPoint | null;
  markers?: MapMarker[];
  cells?: MapCell[];
  /** Makes the map a place picker: a tap gives the position and a fingertip's accuracy. */
  onPlace?: (p: PlacedPoint) => void;
  /** Fit the view to the point and its circle rather than to the whole area. */
  focusPoint?: boolean;
  className?: string;
  /** Load and draw the map only when it comes near the screen (pages where it sits below the fold). */
  whenShown?: boolean;
  /**
   * Show the SVG zone map and load the real map (Leaflet, tiles, the records) only when the
   * reader asks: Leaflet and its drawing stay out of the page's first load (issue 18).
   */
  onRequest?: boolean;
};
