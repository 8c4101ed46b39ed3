"use client";

import "leaflet/dist/leaflet.css";
import L from "leaflet";
import { useTranslations } from "next-intl";
import { useEffect, useRef } from "react";
import type { ArealGeometry } from "@/lib/geo/areal";
import { COLOURS, createBaseMap, latLngsOf, ZONE_FILLS } from "./leaflet-base";

export type Corner = [number, number]; // [longitude, latitude]

type Props = {
  tileUrl: string | null;
  attribution: string;
  label: string;
  /** The shapes around the one drawn (the area, the other zones), for orientation. */
  context: { name: string; geometry: ArealGeometry; isArea: boolean }[];
  corners: Corner[];
  onChange: (corners: Corner[]) => void;
  className?: string;
};

// A small polygon editor of our own on Leaflet: a tap adds a corner, a corner's marker can be
// dragged (or moved with the keyboard: focus it and use the arrow keys, as Leaflet allows).
export default function ZoneEditorMap({ tileUrl, attribution, label, context, corners, onChange, className }: Props) {
  const t = useTranslations("Map");
  const box = useRef<HTMLDivElement>(null);
  const mapRef = useRef<L.Map | null>(null);
  const contextLayer = useRef<L.LayerGroup | null>(null);
  const drawLayer = useRef<L.LayerGroup | null>(null);
  const cornersRef = useRef(corners);
  const changeRef = useRef(onChange);
  const fitted = useRef(false);
  const zoomIn = t("zoomIn");
  const zoomOut = t("zoomOut");
  const demoAttribution = t("demoAttribution");

  useEffect(() => {
    cornersRef.current = corners;
    changeRef.current = onChange;
  });

  useEffect(() => {
    if (!box.current) return;
    const map = tileUrl
      ? createBaseMap(box.current, tileUrl, { zoomIn, zoomOut, attribution: attribution || demoAttribution }).map
      : L.map(box.current, { zoomControl: true, attributionControl: false });
    map.doubleClickZoom.disable();
    map.on("click", (e: L.LeafletMouseEvent) => {
      const c: Corner = [Math.round(e.latlng.lng * 1e7) / 1e7, Math.round(e.latlng.lat * 1e7) / 1e7];
      changeRef.current([...cornersRef.current, c]);
    });
    mapRef.current = map;
    contextLayer.current = L.layerGroup().addTo(map);
    drawLayer.current = L.layerGroup().addTo(map);
    return () => {
      map.remove();
      mapRef.current = null;
      fitted.current = false;
    };
  }, [tileUrl, attribution, zoomIn, zoomOut, demoAttribution]);

  useEffect(() => {
    const map = mapRef.current;
    const layer = contextLayer.current;
    if (!map || !layer) return;
    layer.eachLayer((l) => void l.unbindTooltip());
    layer.clearLayers();
    const bounds = L.latLngBounds([]);
    context.forEach((c, i) => {
      const p = L.polygon(latLngsOf(c.geometry), {
        color: COLOURS.ink,
        weight: c.isArea ? 2 : 1,
        fill: !c.isArea,
        fillColor: ZONE_FILLS[i % ZONE_FILLS.length],
        fillOpacity: 0.25,
        interactive: false,
      }).addTo(layer);
      if (!c.isArea) p.bindTooltip(c.name, { permanent: true, direction: "center", className: "ecotone-zone-label" });
      bounds.extend(p.getBounds());
    });
    for (const [lon, lat] of cornersRef.current) bounds.extend([lat, lon]);
    if (!fitted.current) {
      if (bounds.isValid()) map.fitBounds(bounds, { padding: [16, 16], maxZoom: 17 });
      else map.setView([52.105, -1.81], 14); // nothing drawn yet: the demo's vale (any start will do)
      fitted.current = true;
    }
  }, [context]);

  const cornerTitle = (n: number) => t("editorCorner", { n });
  useEffect(() => {
    const layer = drawLayer.current;
    if (!layer) return;
    layer.clearLayers();
    const latlngs = corners.map(([lon, lat]) => [lat, lon] as [number, number]);
    if (latlngs.length >= 2)
      L.polygon(latlngs, {
        color: COLOURS.record,
        weight: 3,
        fillColor: COLOURS.record,
        fillOpacity: 0.15,
        interactive: false,
      }).addTo(layer);
    corners.forEach(([lon, lat], i) => {
      const m = L.marker([lat, lon], {
        draggable: true,
        autoPan: true,
        title: cornerTitle(i + 1),
        alt: cornerTitle(i + 1),
        icon: L.divIcon({ className: "", html: '<span class="ecotone-vertex"></span>', iconSize: [18, 18] }),
      }).addTo(layer);
      m.on("dragend", () => {
        const p = m.getLatLng();
        const next = [...cornersRef.current];
        next[i] = [Math.round(p.lng * 1e7) / 1e7, Math.round(p.lat * 1e7) / 1e7];
        changeRef.current(next);
      });
    });
    // eslint-disable-next-line react-hooks/exhaustive-deps -- the title follows the translations, not identity
  }, [corners]);

  return (
    <div
      ref={box}
      role="region"
      aria-label={label}
      data-map="zone-editor"
      className={className ?? "h-96 w-full rounded-lg border-2 border-reed-700"}
    />
  );
}
