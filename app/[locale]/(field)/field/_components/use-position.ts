"use client";

import { useEffect, useState } from "react";

export type Position = { latitude: number; longitude: number; accuracyM: number; at: number };
export type PositionState = { fix: Position | null; error: "denied" | "unavailable" | "unsupported" | null };

/** The phone's position while the field log is open (Geolocation API, high accuracy). */
export function usePosition(active: boolean, onFix?: (p: Position) => void): PositionState {
  const [state, setState] = useState<PositionState>({ fix: null, error: null });
  const unsupported = active && typeof navigator !== "undefined" && !("geolocation" in navigator);
  useEffect(() => {
    if (!active || !("geolocation" in navigator)) return;
    const id = navigator.geolocation.watchPosition(
      (p) => {
        const fix = {
          latitude: p.coords.latitude,
          longitude: p.coords.longitude,
          accuracyM: Math.round(p.coords.accuracy * 10) / 10,
          at: p.timestamp,
        };
        setState({ fix, error: null });
        onFix?.(fix);
      },
      (err) => setState((s) => ({ fix: s.fix, error: err.code === err.PERMISSION_DENIED ? "denied" : "unavailable" })),
      { enableHighAccuracy: true, maximumAge: 10_000, timeout: 30_000 },
    );
    return () => navigator.geolocation.clearWatch(id);
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [active]);
  return unsupported ? { fix: null, error: "unsupported" } : state;
}
