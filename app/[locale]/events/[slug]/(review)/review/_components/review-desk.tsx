"use client";

import { useLocale, useTranslations } from "next-intl";
import { useCallback, useEffect, useEffectEvent, useState } from "react";
import useSWR from "swr";
import useSWRInfinite from "swr/infinite";
import { secondaryButtonClass } from "@/components/ui/field";
import { api, ApiClientError, fetcher } from "@/lib/http/client";
import type { QueueItem } from "@/db/queries/review";
import { DESK_KEYS } from "@/lib/review/decisions";
import type { CheckMark, RejectReason, ReviewState, TaxonGroup } from "@/lib/domain";
import { ReviewStateMark } from "@/components/state-mark";
import { MarkChips } from "./mark-chips";
import { DecisionPanel, type DecisionBody, type Mode } from "./decision-panel";
import { filterParams, type DetailResponse, type Filters, type QueueResponse } from "./desk-api";
import { DetailPane } from "./detail-pane";
import { FilterBar } from "./filter-bar";

type Props = {
  eventId: string;
  timeZone: string;
  zones: { id: string; name: string }[];
  volunteers: { id: string; name: string }[];
  groups: TaxonGroup[];
  marks: CheckMark[];
  states: ReviewState[];
  reasons: RejectReason[];
};

const TO_STATE = { approve: "approved", reject: "rejected", return: "returned" } as const;

export function ReviewDesk(props: Props) {
  const { eventId, timeZone } = props;
  const t = useTranslations("ReviewDesk");
  const tGroup = useTranslations("TaxonGroup");
  const locale = useLocale();
  const [filters, setFilters] = useState<Filters>({ state: "pending", order: "newest" });
  const [selected, setSelected] = useState(-1);
  const [mode, setMode] = useState<Mode>(null);
  const [status, setStatus] = useState<{ text: string; bad?: boolean } | null>(null);
  const [bulkOpen, setBulkOpen] = useState(false);
  const [showKeys, setShowKeys] = useState(true);
  const [busy, setBusy] = useState(false);

  const base = `/api/events/${eventId}/review`;
  // The server's own words for a refusal; without an answer, the network's fault.
  const refusal = useCallback(
    (err: unknown) => (err instanceof ApiClientError && err.problem) || t("errors.network"),
    [t],
  );
  const query = filterParams(filters).toString();
  const queue = useSWRInfinite<QueueResponse>(
    (_index, previous: QueueResponse | null) => {
      if (previous && !previous.nextCursor) return null;
      const params = new URLSearchParams(query);
      if (previous?.nextCursor) params.set("cursor", previous.nextCursor);
      return `${base}/queue?${params}`;
    },
    fetcher,
    { revalidateFirstPage: true, revalidateOnFocus: false },
  );
  const items = queue.data?.flatMap((p) => p.items) ?? [];
  const counts = queue.data?.[0]?.counts;
  const current: QueueItem | undefined = items[selected];
  const detailKey = current ? `${base}/sightings/${current.id}` : null;
  const detail = useSWR<DetailResponse>(detailKey, fetcher, { revalidateOnFocus: false });

  // A new filter starts a new list (state adjusted while rendering, as React advises, not in an effect).
  const [listQuery, setListQuery] = useState(query);
  if (listQuery !== query) {
    setListQuery(query);
    setSelected(-1);
    setMode(null);
    setBulkOpen(false);
  }

  const move = useCallback(
    (by: number) => {
      setMode(null);
      setSelected((i) => Math.max(0, Math.min(items.length - 1, i + by)));
    },
    [items.length],
  );

  // Keep the selected row in view as the keys move through the list.
  useEffect(() => {
    if (current) document.getElementById(`row-${current.id}`)?.scrollIntoView({ block: "nearest" });
  }, [current]);

  const decide = useCallback(
    async (item: QueueItem, body: DecisionBody) => {
      const toState: ReviewState = body.action === "reidentify" ? item.reviewState : TO_STATE[body.action];
      // The version the coordinator is looking at: the detail pane may be fresher than the list.
      const shown = detail.data?.sighting.id === item.id ? detail.data.sighting.version : 0;
      const seenVersion = Math.max(item.version, shown);
      const leaves = Boolean(filters.state && filters.state !== toState);
      const label = t(`actions.${body.action}`);
      const before = queue.data;
      const optimistic = before?.map((page, i) => ({
        ...page,
        items: leaves
          ? page.items.filter((x) => x.id !== item.id)
          : page.items.map((x) => (x.id === item.id ? { ...x, reviewState: toState, version: x.version + 1 } : x)),
        counts:
          i === 0 && toState !== item.reviewState
            ? {
                ...page.counts,
                [item.reviewState]: page.counts[item.reviewState] - 1,
                [toState]: page.counts[toState] + 1,
              }
            : page.counts,
      }));
      setMode(null);
      setBusy(true);
      setStatus({ text: t("actions.working") });
      if (!leaves) setSelected((i) => Math.min(i + 1, items.length - 1));
      try {
        await queue.mutate(
          async () => {
            await api.send(`${base}/sightings/${item.id}/decisions`, "POST", { ...body, version: seenVersion });
            return undefined;
          },
          { optimisticData: optimistic, rollbackOnError: true, populateCache: false, revalidate: true },
        );
        setStatus({ text: t("actions.saved", { decision: label }) });
      } catch (err) {
        // Rolled back to what was shown; then reloaded, so a second try uses the current version.
        setStatus({ text: t("actions.refused", { message: refusal(err) }), bad: true });
        if (!leaves) setSelected((i) => Math.max(i - 1, 0));
        void queue.mutate();
      } finally {
        setBusy(false);
        void detail.mutate();
      }
    },
    [base, detail, filters.state, items.length, queue, refusal, t],
  );

  const bulkApprove = useCallback(async () => {
    const n = counts?.pending ?? 0;
    setBulkOpen(false);
    setBusy(true);
    setStatus({ text: t("actions.working") });
    try {
      const res = await api.send<{ approved: number }>(`${base}/bulk-approve`, "POST", { filters, expectedCount: n });
      setStatus({ text: t("actions.bulkDone", { n: res.approved }) });
    } catch (err) {
      setStatus({ text: t("actions.refused", { message: refusal(err) }), bad: true });
    } finally {
      setBusy(false);
      await queue.mutate();
    }
  }, [base, counts?.pending, filters, queue, refusal, t]);

  // The keyboard: documented in DESK_KEYS and listed on screen.
  const onKey = useEffectEvent((e: KeyboardEvent) => {
    if (e.ctrlKey || e.metaKey || e.altKey) return;
    if (e.key === "Escape") {
      setMode(null);
      setBulkOpen(false);
      return;
    }
    const target = e.target as HTMLElement | null;
    if (target?.closest("input, textarea, select, [contenteditable='true']")) return;
    const [go, item, send, working] = [move, current, decide, busy];
    const key = e.key;
    if (key === DESK_KEYS.next) go(1);
    else if (key === DESK_KEYS.previous) go(-1);
    else if (key === DESK_KEYS.help) setShowKeys((v) => !v);
    else if (key === DESK_KEYS.bulk) setBulkOpen(true);
    else if (item && !working && key === DESK_KEYS.approve) void send(item, { action: "approve" });
    else if (item && key === DESK_KEYS.reject) setMode("reject");
    else if (item && key === DESK_KEYS.returnWithQuestion) setMode("return");
    else if (item && key === DESK_KEYS.reidentify) setMode("reidentify");
    else return;
    e.preventDefault();
  });
  useEffect(() => {
    const listener = (e: KeyboardEvent) => onKey(e);
    window.addEventListener("keydown", listener);
    return () => window.removeEventListener("keydown", listener);
  }, []);

  const when = (v: string) =>
    new Intl.DateTimeFormat(locale, { dateStyle: "short", timeStyle: "short", timeZone }).format(new Date(v));
  const keyList: [string, string][] = [
    [DESK_KEYS.next, t("keys.next")],
    [DESK_KEYS.previous, t("keys.previous")],
    [DESK_KEYS.approve, t("keys.approve")],
    [DESK_KEYS.reject, t("keys.reject")],
    [DESK_KEYS.returnWithQuestion, t("keys.return")],
    [DESK_KEYS.reidentify, t("keys.reidentify")],
    [DESK_KEYS.bulk, t("keys.bulk")],
    ["Esc", t("keys.escape")],
    [DESK_KEYS.help, t("keys.help")],
  ];

  return (
    <div className="space-y-3">
      <FilterBar {...props} filters={filters} onChange={setFilters} />

      <div className="flex flex-wrap items-center justify-between gap-2">
        <section aria-label={t("counts")}>
          <ul className="flex flex-wrap gap-2 text-sm">
            {props.states.map((s) => (
              <li key={s} className="flex items-center gap-1">
                <ReviewStateMark state={s} />
                <span>{counts ? counts[s] : "…"}</span>
              </li>
            ))}
          </ul>
        </section>
        <button
          type="button"
          className={secondaryButtonClass}
          onClick={() => setBulkOpen(true)}
          aria-keyshortcuts={DESK_KEYS.bulk}
          disabled={busy}
        >
          {t("actions.bulk")} <kbd className="ms-2 rounded border px-1 text-xs">{DESK_KEYS.bulk}</kbd>
        </button>
      </div>

      {bulkOpen ? (
        <div
          role="alertdialog"
          aria-labelledby="bulk-question"
          className="rounded-lg border-2 border-heath-600 bg-heath-50 p-3"
        >
          {counts && counts.pending > 0 ? (
            <>
              <p id="bulk-question" className="font-semibold">
                {t("actions.bulkConfirm", { n: counts.pending })}
              </p>
              <div className="mt-2 flex gap-2">
                <button
                  type="button"
                  autoFocus
                  className="inline-flex min-h-touch items-center rounded-lg bg-reed-700 px-4 font-semibold text-paper"
                  onClick={() => void bulkApprove()}
                >
                  {t("actions.bulkYes", { n: counts.pending })}
                </button>
                <button type="button" className={secondaryButtonClass} onClick={() => setBulkOpen(false)}>
                  {t("actions.cancel")}
                </button>
              </div>
            </>
          ) : (
            <>
              <p id="bulk-question">{t("actions.bulkNone")}</p>
              <button
                type="button"
                autoFocus
                className={`${secondaryButtonClass} mt-2`}
                onClick={() => setBulkOpen(false)}
              >
                {t("actions.cancel")}
              </button>
            </>
          )}
        </div>
      ) : null}

      <p
        role="status"
        aria-live="polite"
        className={`min-h-6 text-sm font-semibold ${status?.bad ? "text-signal" : "text-reed-800"}`}
      >
        {status?.text ?? ""}
      </p>

      <div className="grid gap-4 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
        <section aria-labelledby="queue-title" className="min-w-0">
          <h2 id="queue-title" className="sr-only">
            {t("queue.title")}
          </h2>
          <div className="max-h-[70vh] overflow-auto rounded-lg border border-reed-200 bg-white/70">
            <table className="w-full border-collapse text-sm" aria-label={t("queue.title")}>
              <thead className="sticky top-0 bg-paper-deep text-start">
                <tr>
                  <th scope="col" className="p-2">
                    {t("queue.observed")}
                  </th>
                  <th scope="col" className="p-2">
                    {t("queue.taxon")}
                  </th>
                  <th scope="col" className="p-2 text-end">
                    {t("queue.count")}
                  </th>
                  <th scope="col" className="p-2">
                    {t("queue.volunteer")}
                  </th>
                  <th scope="col" className="p-2">
                    {t("queue.state")}
                  </th>
                </tr>
              </thead>
              <tbody>
                {items.map((item, i) => (
                  <tr
                    key={item.id}
                    id={`row-${item.id}`}
                    aria-selected={i === selected}
                    onClick={() => {
                      setSelected(i);
                      setMode(null);
                    }}
                    className={`cursor-pointer border-t border-reed-100 align-top ${i === selected ? "bg-heath-100 outline outline-2 outline-heath-600" : "hover:bg-reed-50"}`}
                  >
                    <td className="whitespace-nowrap p-2">
                      <button
                        type="button"
                        className="text-start underline-offset-2 hover:underline"
                        onClick={(e) => {
                          e.stopPropagation();
                          setSelected(i);
                          setMode(null);
                        }}
                      >
                        {when(item.observedAt)}
                      </button>
                    </td>
                    <td className="p-2">
                      <span className="font-semibold">
                        {item.commonName ?? item.scientificName ?? t("queue.unidentified")}
                      </span>
                      {item.scientificName ? (
                        <i className="block text-ink-soft">{item.scientificName}</i>
                      ) : (
                        <span className="block text-ink-soft">{item.description}</span>
                      )}
                      <span className="block text-xs text-ink-soft">
                        {item.taxonGroup ? tGroup(item.taxonGroup) : ""}
                        {item.zoneName ? ` · ${item.zoneName}` : ""}
                        {item.photoCount ? ` · ${t("queue.photos", { n: item.photoCount })}` : ""}
                      </span>
                      <MarkChips marks={item.checkMarks} />
                    </td>
                    <td className="p-2 text-end tabular-nums">
                      {item.countIsEstimate ? t("queue.about", { count: item.count }) : item.count}
                    </td>
                    <td className="p-2">{item.volunteerName}</td>
                    <td className="p-2">
                      <ReviewStateMark state={item.reviewState} />
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
            {queue.isLoading ? <p className="p-3">{t("queue.loading")}</p> : null}
            {!queue.isLoading && items.length === 0 ? <p className="p-3">{t("queue.empty")}</p> : null}
            {queue.error ? (
              <p role="alert" className="p-3 font-semibold text-signal">
                {refusal(queue.error)}
              </p>
            ) : null}
          </div>
          <div className="mt-2 flex items-center gap-3 text-sm">
            <span>{t("queue.shown", { shown: items.length })}</span>
            {queue.data?.[queue.data.length - 1]?.nextCursor ? (
              <button type="button" className={secondaryButtonClass} onClick={() => void queue.setSize(queue.size + 1)}>
                {t("queue.loadMore")}
              </button>
            ) : null}
          </div>
        </section>

        <section
          aria-label={t("detail.title")}
          className="min-w-0 space-y-3 rounded-lg border border-reed-200 bg-white/70 p-3"
        >
          {current ? (
            <>
              <DecisionPanel
                key={current.id}
                item={current}
                mode={mode}
                setMode={setMode}
                reasons={props.reasons}
                eventId={eventId}
                busy={busy}
                onDecide={(body) => void decide(current, body)}
              />
              {detail.data && detail.data.sighting.id === current.id ? (
                <DetailPane detail={detail.data} timeZone={timeZone} eventId={eventId} />
              ) : (
                <p>{t("detail.loading")}</p>
              )}
            </>
          ) : (
            <p>{t("detail.noneSelected")}</p>
          )}
        </section>
      </div>

      {showKeys ? (
        <aside aria-labelledby="keys-title" className="rounded-lg border border-reed-200 bg-paper-deep p-3 text-sm">
          <h2 id="keys-title" className="font-bold text-reed-900">
            {t("keys.title")}
          </h2>
          <ul className="mt-1 grid gap-x-6 gap-y-1 sm:grid-cols-3">
            {keyList.map(([k, label]) => (
              <li key={k}>
                <kbd className="me-2 inline-block min-w-6 rounded border border-reed-700 bg-white px-1 text-center font-mono">
                  {k}
                </kbd>
                {label}
              </li>
            ))}
          </ul>
        </aside>
      ) : null}
    </div>
  );
}
