"use client";

import { useTranslations } from "next-intl";
import { lazy, Suspense, useCallback, useEffect, useRef, useState } from "react";
import { announceChange, announceToOtherTabs, registerServiceWorker, requestBackgroundSync } from "@/lib/field/client";
import { openFieldDb, type FieldDatabase } from "@/lib/field/db";
import { later } from "@/lib/field/later";
import type { SyncReport } from "@/lib/field/sync";
import type { KnownEvent } from "@/lib/field/types";

// An event's log (the list, the session panel, the map, the species search) is fetched once an
// event is chosen, from the service worker's precache when offline; the first load carries only
// the chooser (issue 18). React's lazy rather than next/dynamic: the log is only ever drawn in the
// browser (the storage opens there), and next/dynamic's loader is ~2 KiB more on the first load.
const EventLog = lazy(() => import("./event-log").then((m) => ({ default: m.EventLog })));

// The sync client and the outbox's clock are fetched when an event is open, not with the chooser.
const syncCode = () => import("@/lib/field/sync");
const makeDueNow = (...args: Parameters<typeof import("@/lib/field/outbox").makeDueNow>) =>
  import("@/lib/field/outbox").then((m) => m.makeDueNow(...args));

function Loading() {
  const t = useTranslations("FieldLog");
  return <p className="text-ink-soft">{t("loading")}</p>;
}

const PERIOD_MS = 30_000;
// While the last try found no connection, look again this often (cheap: nothing goes out
// when nothing is due), so records leave within seconds of the connection coming back
// even where the browser never fires "online". Common practice for a foreground retry.
const OFFLINE_RETRY_MS = 3_000;
const LAST_EVENT = "lastEvent";
// The send after a save waits for a pause in saving and an idle moment (lib/field/later.ts), so
// a save never waits behind the sender's IndexedDB transactions (issue 18). Our choice: long
// enough to cover the next tap of a volunteer saving in a row, short enough to feel immediate.
const SEND_AFTER_SAVE_MS = 1_500;
const SEND_IDLE_MS = 1_000;

export type SyncStatus = { running: boolean; last?: SyncReport & { at: number } };

export function FieldApp({ locale, events }: { locale: string; events: KnownEvent[] }) {
  const t = useTranslations("FieldLog");
  const [db, setDb] = useState<FieldDatabase | null>(null);
  const [dbError, setDbError] = useState(false);
  const [eventId, setEventId] = useState<string | null>(null);
  const [online, setOnline] = useState(true);
  const [sync, setSync] = useState<SyncStatus>({ running: false });
  const [packVersion, setPackVersion] = useState(0);
  const running = useRef(false);
  const again = useRef(false);

  useEffect(() => {
    void registerServiceWorker(locale);
    openFieldDb().then(
      async (d) => {
        setOnline(navigator.onLine);
        setDb(d);
        const fromUrl = new URLSearchParams(window.location.search).get("event");
        const last = (await d.get("meta", LAST_EVENT)) as string | undefined;
        const pick =
          [fromUrl, last].find((id) => id && events.some((e) => e.id === id)) ??
          (events.length === 1 ? events[0]!.id : null);
        setEventId(pick ?? null);
      },
      () => setDbError(true),
    );
  }, [locale, events]);

  const runSync = useCallback(async (): Promise<SyncReport | undefined> => {
    if (!db || !eventId) return undefined;
    if (running.current) {
      again.current = true; // asked while a send is on its way: go once more right after
      return { ran: false, sent: 0, refused: 0, photosSent: 0 };
    }
    let last: SyncReport | undefined;
    running.current = true;
    setSync((s) => ({ ...s, running: true }));
    try {
      do {
        again.current = false;
        const { syncEvent } = await syncCode();
        const report = await syncEvent(db, eventId, Date.now, announceChange);
        last = report;
        setSync({ running: false, last: { ...report, at: Date.now() } });
        // The status says what actually happened: an answer from the server means online.
        if (report.problem === "offline") setOnline(false);
        else if (report.ran) setOnline(true);
        announceChange();
      } while (again.current);
    } catch {
      setSync((s) => ({ ...s, running: false }));
    } finally {
      running.current = false;
    }
    return last;
  }, [db, eventId]);

  // Sync when the app opens, when the network returns, and every half minute while open.
  useEffect(() => {
    if (!db || !eventId) return;
    void db.put("meta", eventId, LAST_EVENT);
    const url = new URL(window.location.href);
    if (url.searchParams.get("event") !== eventId) {
      url.searchParams.set("event", eventId);
      window.history.replaceState(window.history.state, "", url);
    }
    const open = async () => {
      if (navigator.onLine) {
        // navigator.onLine can say "online" with no way out; a failed fetch is the truth.
        const r = await syncCode()
          .then(({ refreshPack }) => refreshPack(db, eventId))
          .then(
            (x) => {
              setOnline(true);
              return x;
            },
            () => {
              setOnline(false);
              return null;
            },
          );
        if (r?.changed) setPackVersion((v) => v + 1);
      }
      await runSync();
    };
    void open();
    const back = () => void makeDueNow(db).then(open);
    const gone = () => setOnline(false);
    window.addEventListener("online", back);
    window.addEventListener("offline", gone);
    const timer = window.setInterval(() => void runSync(), PERIOD_MS);
    const quick = window.setInterval(() => {
      if (!online) void makeDueNow(db, eventId).then(runSync);
    }, OFFLINE_RETRY_MS);
    return () => {
      window.clearInterval(quick);
      window.removeEventListener("online", back);
      window.removeEventListener("offline", gone);
      window.clearInterval(timer);
    };
  }, [db, eventId, runSync, online]);

  // After a save: the record is stored (its transaction has completed); this tab's list shows it
  // already. The send follows once saving pauses; hiding or leaving the page sends at once,
  // and the service worker's Background Sync (or the next opening) sends what is left.
  const sendLater = useRef<ReturnType<typeof later> | null>(null);
  useEffect(() => {
    // The page sends; the service worker's Background Sync is asked for only when the page may
    // not finish (it is being left) or could not send (offline, server trouble), so the two do
    // not walk the same stores one after the other after every save.
    const send = () =>
      void runSync().then((report) => {
        if (!report || report.problem) void requestBackgroundSync();
      });
    const l = later(send, SEND_AFTER_SAVE_MS, SEND_IDLE_MS);
    sendLater.current = l;
    const leave = () => {
      if (!l.pending()) return;
      void requestBackgroundSync();
      l.flush();
    };
    const hidden = () => {
      if (document.visibilityState === "hidden") leave();
    };
    document.addEventListener("visibilitychange", hidden);
    window.addEventListener("pagehide", leave);
    return () => {
      document.removeEventListener("visibilitychange", hidden);
      window.removeEventListener("pagehide", leave);
      l.flush(); // the event or the database changes: what waits goes now, not never
      sendLater.current = null;
    };
  }, [runSync]);

  const afterSave = useCallback(() => {
    announceToOtherTabs();
    sendLater.current?.schedule();
  }, []);

  if (dbError)
    return (
      <p role="alert" className="rounded-lg border-2 border-signal bg-signal-soft p-4 font-semibold text-signal">
        {t("noStorage")}
      </p>
    );
  if (!db) return <Loading />;

  if (!eventId) {
    return (
      <section aria-labelledby="pick-title" className="space-y-3">
        <h2 id="pick-title" className="text-xl font-bold text-reed-900">
          {t("pickEvent")}
        </h2>
        {events.length === 0 ? (
          <p>{t("noEvents")}</p>
        ) : (
          <ul className="space-y-3">
            {events.map((e) => (
              <li key={e.id}>
                <button
                  type="button"
                  onClick={() => setEventId(e.id)}
                  className="flex min-h-touch w-full flex-col items-start rounded-xl border-2 border-reed-700 bg-white p-4 text-start text-lg font-bold text-reed-900"
                >
                  {e.name}
                  <span className="text-base font-normal text-ink-soft">
                    {e.status === "open" ? t("eventOpen") : t("eventClosed")}
                  </span>
                </button>
              </li>
            ))}
          </ul>
        )}
      </section>
    );
  }

  const event = events.find((e) => e.id === eventId)!;
  return (
    <Suspense fallback={<Loading />}>
      <EventLog
        key={`${eventId}:${packVersion}`}
        db={db}
        event={event}
        locale={locale}
        online={online}
        sync={sync}
        onSyncNow={() => void makeDueNow(db, eventId).then(runSync)}
        onSaved={afterSave}
        onSwitchEvent={events.length > 1 ? () => setEventId(null) : undefined}
      />
    </Suspense>
  );
}
