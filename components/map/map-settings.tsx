"use client";

import { createContext, useContext, type ReactNode } from "react";
import type { MapSettings } from "@/lib/geo/tiles";

export type { MapSettings };

// The base map's settings (lib/env.ts MAP_TILE_URL, MAP_TILE_ATTRIBUTION), handed down by the
// server page that shows a map. Without them a map falls back to the SVG zone map.

const Context = createContext<MapSettings | null>(null);

export function MapSettingsProvider({ settings, children }: { settings: MapSettings; children: ReactNode }) {
  return <Context.Provider value={settings}>{children}</Context.Provider>;
}

export function useMapSettings(): MapSettings | null {
  return useContext(Context);
}
