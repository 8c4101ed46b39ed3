"use client";

import { useCallback, useEffect, useState } from "react";
import type { FieldDatabase } from "@/lib/field/db";
import { onChange } from "@/lib/field/client";
import { eventRecords } from "@/lib/field/outbox";
import type { LocalPhoto, LocalSession, LocalSighting, StoredMine, StoredPack } from "@/lib/field/types";

export type FieldData = {
  sessions: LocalSession[];
  sightings: LocalSighting[];
  photos: LocalPhoto[];
  pack: StoredPack | null;
  mine: StoredMine | null;
  loaded: boolean;
};

const empty: FieldData = { sessions: [], sightings: [], photos: [], pack: null, mine: null, loaded: false };

async function readEvent(db: FieldDatabase, eventId: string): Promise<FieldData> {
  const [records, pack, mine] = await Promise.all([
    eventRecords(db, eventId),
    db.get("packs", eventId),
    db.get("mine", eventId),
  ]);
  return { ...records, pack: pack ?? null, mine: mine ?? null, loaded: true };
}

/** Everything the device holds for one event, reloaded whenever a tab or the service worker changes it. */
export function useFieldData(db: FieldDatabase | null, eventId: string | null) {
  // Loaded data remembers the event it belongs to: another event shows nothing until its own is read.
  const [held, setHeld] = useState<{ eventId: string | null; data: FieldData }>({ eventId: null, data: empty });
  const reload = useCallback(async () => {
    if (!db || !eventId) return;
    setHeld({ eventId, data: await readEvent(db, eventId) });
  }, [db, eventId]);
  // A sighting this tab has just saved goes into the list as stored, without reading the whole event again.
  const putSighting = useCallback(
    (entry: LocalSighting) =>
      setHeld((h) =>
        h.eventId === entry.eventId
          ? { ...h, data: { ...h.data, sightings: [...h.data.sightings.filter((s) => s.id !== entry.id), entry] } }
          : h,
      ),
    [],
  );
  useEffect(() => {
    if (!db || !eventId) return;
    let live = true;
    const load = () =>
      void readEvent(db, eventId).then((data) => {
        if (live) setHeld({ eventId, data });
      });
    load();
    const off = onChange(load);
    return () => {
      live = false;
      off();
    };
  }, [db, eventId]);
  return { data: held.eventId === eventId ? held.data : empty, reload, putSighting };
}
