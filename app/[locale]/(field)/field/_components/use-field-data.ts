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

/** Everything the device holds for one event, reloaded whenever a tab or the service worker changes it. */
export function useFieldData(db: FieldDatabase | null, eventId: string | null) {
  const [data, setData] = useState<FieldData>(empty);
  const reload = useCallback(async () => {
    if (!db || !eventId) return;
    const [records, pack, mine] = await Promise.all([
      eventRecords(db, eventId),
      db.get("packs", eventId),
      db.get("mine", eventId),
    ]);
    setData({ ...records, pack: pack ?? null, mine: mine ?? null, loaded: true });
  }, [db, eventId]);
  useEffect(() => {
    setData(empty);
    void reload();
    return onChange(() => void reload());
  }, [reload]);
  return { data, reload };
}
