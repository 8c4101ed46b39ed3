"use client";

import "leaflet/dist/leaflet.css";
import L from "leaflet";
import { useTranslations } from "next-intl";
import { useEffect, useRef } from "react";
import { COLOURS, createBaseMap, latLngsOf, metresPerPixel, ZONE_FILLS } from "./leaflet-base";
import type { RealMapProps } from "./types";

const FINGERTIP_PX = 24; // the ground width of a fingertip is the accuracy of a tapped point

type Props = RealMapProps & { tileUrl: string; attribution: string; onTiles?: (ok: boolean) => void };

// The real map (Leaflet 1.9, raster tiles from MAP_TILE_URL): area, zones, records, the
// phone's position and generalised cells. Loaded only when a map is on screen (real-map.tsx).
export default function LeafletMap(props: Props) {
  const t = useTranslations("Map");
  const box = useRef<HTMLDivElement>(null);
  const mapRef = useRef<L.Map | null>(null);
  const layerRef = useRef<L.LayerGroup | null>(null);
  const placeRef = useRef(props.onPlace);
  const tilesRef = useRef(props.onTiles);
  const fittedRef = useRef<string | null>(null);
  const { tileUrl, attribution } = props;
  const zoomIn = t("zoomIn");
  const zoomOut = t("zoomOut");
  const demoAttribution = t("demoAttribution");

  useEffect(() => {
    placeRef.current = props.onPlace;
    tilesRef.current = props.onTiles;
  });

  useEffect(() => {
    if (!box.current) return;
    const { map } = createBaseMap(
      box.current,
      tileUrl,
      { zoomIn, zoomOut, attribution: attribution || demoAttribution },
      (ok) => tilesRef.current?.(ok),
    );
    map.on("click", (e: L.LeafletMouseEvent) => {
      const place = placeRef.current;
      if (!place) return;
      place({
        longitude: Math.round(e.latlng.lng * 1e6) / 1e6,
        latitude: Math.round(e.latlng.lat * 1e6) / 1e6,
        accuracyM: Math.max(1, Math.round(metresPerPixel(e.latlng.lat, map.getZoom()) * FINGERTIP_PX)),
      });
    });
    mapRef.current = map;
    layerRef.current = L.layerGroup().addTo(map);
    return () => {
      map.remove();
      mapRef.current = null;
      layerRef.current = null;
      fittedRef.current = null;
    };
  }, [tileUrl, attribution, zoomIn, zoomOut, demoAttribution]);

  const { area, zones, zoneId, point, here, markers, cells, focusPoint, onPlace } = props;
  const pointLabel = t("recordPoint");
  const hereLabel = t("youAreHere");
  useEffect(() => {
    const map = mapRef.current;
    const layer = layerRef.current;
    if (!map || !layer) return;
    // Permanent tooltips (zone names) live on the map itself: unbind them with their layers.
    layer.eachLayer((l) => void l.unbindTooltip());
    layer.clearLayers();
    const bounds = L.latLngBounds([]);
    if (area) {
      const a = L.polygon(latLngsOf(area), {
        color: COLOURS.area,
        weight: 2,
        fill: false,
        interactive: false,
      }).addTo(layer);
      bounds.extend(a.getBounds());
    }
    zones.forEach((z, i) => {
      const here = z.id === zoneId;
      const p = L.polygon(latLngsOf(z.geometry), {
        color: COLOURS.ink,
        weight: here ? 3 : 1,
        dashArray: here || !zoneId ? undefined : "4 3",
        fillColor: ZONE_FILLS[i % ZONE_FILLS.length],
        fillOpacity: 0.3,
        interactive: false,
      }).addTo(layer);
      p.bindTooltip(z.name, { permanent: true, direction: "center", className: "ecotone-zone-label" });
      bounds.extend(p.getBounds());
    });
    for (const c of cells ?? []) {
      L.polygon(latLngsOf(c.geometry), {
        color: COLOURS.sensitive,
        weight: 1.5,
        dashArray: "2 2",
        fillColor: COLOURS.sensitive,
        fillOpacity: 0.2,
      })
        .bindTooltip(c.label)
        .addTo(layer);
    }
    for (const m of markers ?? []) {
      L.circleMarker([m.latitude, m.longitude], {
        radius: 5,
        color: COLOURS.paper,
        weight: 1.5,
        fillColor: COLOURS.ink,
        fillOpacity: 0.9,
      })
        .bindTooltip(m.label)
        .addTo(layer);
    }
    const dot = (p: NonNullable<typeof point>, colour: string, title: string, big: boolean) => {
      if (p.accuracyM) {
        L.circle([p.latitude, p.longitude], {
          radius: p.accuracyM,
          color: colour,
          weight: 1,
          fillColor: colour,
          fillOpacity: 0.12,
          interactive: false,
        }).addTo(layer);
        // Bounds from the radius itself: a circle's getBounds needs a map that already has a view.
        if (focusPoint) bounds.extend(L.latLng(p.latitude, p.longitude).toBounds(p.accuracyM * 2));
      }
      L.marker([p.latitude, p.longitude], {
        icon: L.divIcon({
          className: "",
          html: `<span class="ecotone-map-dot" style="background:${colour};width:${big ? 16 : 12}px;height:${big ? 16 : 12}px"></span>`,
          iconSize: [big ? 16 : 12, big ? 16 : 12],
        }),
        title,
        alt: title,
        keyboard: false,
        interactive: false,
      }).addTo(layer);
      if (focusPoint) bounds.extend([p.latitude, p.longitude]);
    };
    if (here) dot(here, COLOURS.here, hereLabel, false);
    if (point) dot(point, COLOURS.record, pointLabel, Boolean(onPlace));
    // Fit once per shape of the map (a tap that moves the point keeps the view still).
    const key = JSON.stringify([area, zones.map((z) => z.id), focusPoint ? point : null]);
    if (bounds.isValid() && fittedRef.current !== key) {
      map.fitBounds(bounds, { padding: [12, 12], maxZoom: 17 });
      fittedRef.current = key;
    } else if (!bounds.isValid() && fittedRef.current === null) {
      map.setView(
        [here?.latitude ?? point?.latitude ?? 0, here?.longitude ?? point?.longitude ?? 0],
        here || point ? 16 : 2,
      );
      fittedRef.current = key;
    }
  }, [area, zones, zoneId, point, here, markers, cells, focusPoint, onPlace, pointLabel, hereLabel]);

  return (
    <div
      ref={box}
      role="region"
      aria-label={props.label}
      data-map="leaflet"
      className={props.className ?? "h-72 w-full rounded-lg border border-reed-200"}
    />
  );
}
