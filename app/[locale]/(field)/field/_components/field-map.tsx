"use client";

import { useFormatter, useTranslations } from "next-intl";
import { useEffect, useMemo, useState } from "react";
import { useMapSettings } from "@/components/map/map-settings";
import { RealMap, type MapMarker } from "@/components/map/real-map";
import { keepTiles, offlineTileUrls, tileStoreStatus, type TileStore } from "@/lib/field/tiles";
import type { LocalSighting, StoredPack } from "@/lib/field/types";
import type { Position } from "./use-position";

type Props = { pack: StoredPack; sightings: LocalSighting[]; here: Position | null; online: boolean };

// The field log's map: where I am (with the accuracy of the fix), the zones, my sightings;
// and the base map of the event's area kept on the phone for use without a network.
export function FieldMap({ pack, sightings, here, online }: Props) {
  const t = useTranslations("Map");
  const format = useFormatter();
  const settings = useMapSettings();
  const [store, setStore] = useState<TileStore | null>(null);
  const [keeping, setKeeping] = useState(false);
  const [usage, setUsage] = useState<number | null>(null);
  const { area } = pack.pack.event;
  const zones = pack.pack.zones;
  const urls = useMemo(
    () => (settings ? offlineTileUrls(settings.tileUrl, area ? [area] : zones.features.map((f) => f.geometry)) : []),
    [settings, area, zones],
  );

  // With the event pack, the area's tiles: fetched when there is a network, counted always.
  useEffect(() => {
    if (urls.length === 0) return;
    let live = true;
    const done = (s: TileStore) => {
      if (!live) return;
      setStore(s);
      setKeeping(false);
      void navigator.storage?.estimate?.().then((e) => live && setUsage(e.usage ?? null));
    };
    if (online) {
      void Promise.resolve().then(() => live && setKeeping(true));
      void keepTiles(urls, (s) => live && setStore(s)).then(done);
    } else void tileStoreStatus(urls).then(done);
    return () => {
      live = false;
    };
  }, [urls, online]);

  const markers: MapMarker[] = useMemo(
    () =>
      sightings.map((s) => ({
        id: s.id,
        label: s.taxonLabel,
        latitude: s.record.latitude,
        longitude: s.record.longitude,
      })),
    [sightings],
  );
  const zoneList = useMemo(
    () => zones.features.map((f) => ({ id: f.id, name: f.properties.name, geometry: f.geometry })),
    [zones],
  );
  const size = (bytes: number) =>
    bytes < 1_000_000
      ? format.number(Math.max(1, Math.round(bytes / 1000)), { style: "unit", unit: "kilobyte" })
      : format.number(Math.round(bytes / 100_000) / 10, { style: "unit", unit: "megabyte" });

  return (
    <section aria-labelledby="field-map-title" className="space-y-2">
      <h2 id="field-map-title" className="text-xl font-bold text-reed-900">
        {t("fieldTitle")}
      </h2>
      <RealMap
        label={t("fieldLabel")}
        area={area}
        zones={zoneList}
        here={here}
        markers={markers}
        className="h-72 w-full rounded-lg border-2 border-reed-700"
      />
      <p className="text-sm text-ink-soft">{t("fieldLegend")}</p>
      {store ? (
        <p className="text-sm" data-testid="offline-tiles" aria-live="polite">
          {keeping
            ? t("tilesKeeping", { kept: store.kept, total: store.total })
            : store.kept === store.total
              ? t("tilesKept", { total: store.total, size: size(store.bytes) })
              : t("tilesPartly", { kept: store.kept, total: store.total, size: size(store.bytes) })}
          {usage !== null && !keeping ? ` ${t("storageUsed", { size: size(usage) })}` : null}
        </p>
      ) : null}
    </section>
  );
}
