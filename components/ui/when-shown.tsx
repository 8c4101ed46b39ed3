"use client";

import { useEffect, useRef, useState, type ReactNode } from "react";

/**
 * Renders its children (a chart's drawing, a map) once the box comes near the screen: the charts
 * below the fold cost nothing until the reader scrolls to them, and their code (Recharts, Leaflet) is fetched then.
 */
export function WhenShown({
  children,
  className = "h-full w-full",
  fallback = null,
}: {
  children: ReactNode;
  className?: string;
  /** What stands in the box until then (it should have the box's size). */
  fallback?: ReactNode;
}) {
  const box = useRef<HTMLDivElement>(null);
  const [shown, setShown] = useState(false);
  useEffect(() => {
    const el = box.current;
    if (!el) return;
    const seen = new IntersectionObserver(
      (entries) => {
        if (entries.some((e) => e.isIntersecting)) {
          setShown(true);
          seen.disconnect();
        }
      },
      { rootMargin: "200px" },
    );
    seen.observe(el);
    return () => seen.disconnect();
  }, []);
  return (
    <div ref={box} className={className}>
      {shown ? children : fallback}
    </div>
  );
}
