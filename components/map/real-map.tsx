"use client";

import dynamic from "next/dynamic";
import { useTranslations } from "next-intl";
import { useState } from "react";
import { ZoneMap } from "@/components/zone-map";
import { WhenShown } from "@/components/ui/when-shown";
import { useMapSettings } from "./map-settings";
import type { RealMapProps } from "./types";

export type { MapCell, MapMarker, MapPoint, MapZone, PlacedPoint, RealMapProps } from "./types";

function MapLoading({ className }: { className?: string }) {
  const t = useTranslations("Map");
  return (
    <div
      aria-busy="true"
      className={`${className ?? "h-72 w-full"} flex items-center justify-center rounded-lg border border-reed-200 bg-paper-deep text-ink-soft`}
    >
      {t("loading")}
    </div>
  );
}

// Leaflet and its CSS are fetched only when a map is on screen (never on the server).
const LeafletMap = dynamic(() => import("./leaflet-map"), { ssr: false, loading: () => <MapLoading /> });

/**
 * The map of an event: the real map with tiles when there is a tile address, the SVG zone map
 * when there is none or when no tile could be loaded (offline with no tiles kept).
 */
export function RealMap(props: RealMapProps) {
  const settings = useMapSettings();
  const t = useTranslations("Map");
  // Tiles: "unknown" until one loads or fails; a failure before any load means no tiles at all.
  const [tiles, setTiles] = useState<"unknown" | "ok" | "none">("unknown");
  const [asked, setAsked] = useState(false);
  if (!settings || tiles === "none" || (props.onRequest && !asked)) {
    return (
      <div className="space-y-1" data-map="svg">
        <ZoneMap
          zones={props.zones}
          area={props.area}
          point={props.point ?? props.here ?? null}
          zoneId={props.zoneId}
          label={props.label}
          onPlace={props.onPlace}
          className="w-full touch-none rounded-lg border-2 border-reed-700 bg-white"
        />
        {settings && tiles === "none" ? <p className="text-sm text-ink-soft">{t("noTiles")}</p> : null}
        {settings && tiles !== "none" && props.onRequest ? (
          <button
            type="button"
            onClick={() => setAsked(true)}
            className="min-h-touch rounded-lg border-2 border-reed-700 bg-white px-4 font-semibold text-reed-900"
          >
            {t("showRecords")}
          </button>
        ) : null}
      </div>
    );
  }
  const map = (
    <LeafletMap
      {...props}
      tileUrl={settings.tileUrl}
      attribution={settings.attribution}
      onTiles={(ok) => setTiles((s) => (s !== "unknown" ? s : ok ? "ok" : "none"))}
    />
  );
  // On the public pages the map sits below the fold on a phone: Leaflet waits until it is near (issue 18).
  return props.whenShown ? (
    <WhenShown className="" fallback={<MapLoading className={props.className} />}>
      {map}
    </WhenShown>
  ) : (
    map
  );
}
