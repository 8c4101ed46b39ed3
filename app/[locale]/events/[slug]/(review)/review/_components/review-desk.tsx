"use client";

import { useLocale, useTranslations } from "next-intl";
import { usePathname, useRouter, useSearchParams } from "next/navigation";
import { useEffect, useEffectEvent, useState } from "react";
import useSWR, { useSWRConfig } from "swr";
import useSWRInfinite from "swr/infinite";
import { secondaryButtonClass } from "@/components/ui/field";
import { trapTab, useFocusReturn } from "@/components/ui/focus";
import { api, ApiClientError, fetcher } from "@/lib/http/client";
import type { QueueItem } from "@/db/queries/review";
import { DESK_KEYS, keyLabel, TOAST_UNDO_MS, type DeskAction } from "@/lib/review/decisions";
import { formatDayAndTime, formatEventDateTime } from "@/lib/time/regional";
import type { CheckMark, RejectReason, ReviewState, TaxonGroup } from "@/lib/domain";
import { ReviewStateMark } from "@/components/state-mark";
import { MarkChips } from "./mark-chips";
import { DecisionPanel, type DecisionBody, type DecisionLabel, type Mode } from "./decision-panel";
import {
  filterParams,
  filtersFromSearch,
  searchFromFilters,
  type BulkPreviewResponse,
  type DetailResponse,
  type Filters,
  type QueueResponse,
} from "./desk-api";
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

/** The toast after a decision: it names the record, and offers to undo it for a minute. */
type Toast = {
  text: string;
  bad?: boolean;
  undo?: { sightingId: string; reviewId: number; version: number; name: RecordName };
};
type RecordName = Record<"taxon" | "when" | "volunteer", string>;
type DecisionResponse = { sighting: { id: string; version: number }; reviewId: number };

export function ReviewDesk(props: Props) {
  const { eventId, timeZone } = props;
  const t = useTranslations("ReviewDesk");
  const tGroup = useTranslations("TaxonGroup");
  const locale = useLocale();
  // The filters live in the URL: shareable, kept on reload, and the back button goes to the previous ones.
  const router = useRouter();
  const pathname = usePathname();
  const search = useSearchParams();
  // Shown at once and then written to the URL: two filters chosen in quick succession both
  // hold, even before the first navigation has finished. A new URL (the back button) wins.
  const urlKey = search.toString();
  const [filters, setShownFilters] = useState<Filters>(() => filtersFromSearch(search));
  const [seenUrl, setSeenUrl] = useState(urlKey);
  if (seenUrl !== urlKey) {
    setSeenUrl(urlKey);
    setShownFilters(filtersFromSearch(search));
  }
  const setFilters = (f: Filters) => {
    setShownFilters(f);
    const qs = searchFromFilters(f).toString();
    router.push(qs ? `${pathname}?${qs}` : pathname, { scroll: false });
  };
  const [selected, setSelected] = useState(-1);
  const [mode, setMode] = useState<Mode>(null);
  const [status, setStatus] = useState<Toast | null>(null);
  const [bulkOpen, setBulkOpen] = useState(false);
  const [include, setInclude] = useState<CheckMark[]>([]);
  const [showKeys, setShowKeys] = useState(true);
  const [busy, setBusy] = useState(false);

  const base = `/api/events/${eventId}/review`;
  // The server's own words for a refusal; without an answer, the network's fault.
  const refusal = (err: unknown) => (err instanceof ApiClientError && err.problem) || t("errors.network");
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
  // Keyed by the version the queue shows too: after a decision, an undo or another coordinator's
  // change, the pane never shows an older version of the record the list already moved past.
  const detailKey = current ? `${base}/sightings/${current.id}?v=${current.version}` : null;
  const detail = useSWR<DetailResponse>(detailKey, fetcher, { revalidateOnFocus: false });
  // After a decision or an undo, every kept copy of that record's detail is dropped and the one
  // on screen fetched again (a copy fetched while the decision was on its way is out of date).
  const { mutate: mutateAny } = useSWRConfig();
  const refreshDetail = (sightingId: string) =>
    mutateAny((k) => typeof k === "string" && k.startsWith(`${base}/sightings/${sightingId}?`), undefined, {
      revalidate: true,
    });

  // A new filter starts a new list (state adjusted while rendering, as React advises, not in an effect).
  const [listQuery, setListQuery] = useState(query);
  if (listQuery !== query) {
    setListQuery(query);
    setSelected(-1);
    setMode(null);
    setBulkOpen(false);
    setInclude([]);
  }

  // The toast's undo lasts a minute.
  const undoUntil = status?.undo ? status.undo.reviewId : null;
  useEffect(() => {
    if (undoUntil === null) return;
    const timer = setTimeout(
      () => setStatus((s) => (s?.undo?.reviewId === undoUntil ? { text: s.text } : s)),
      TOAST_UNDO_MS,
    );
    return () => clearTimeout(timer);
  }, [undoUntil]);

  // The bulk confirmation is modal: Tab stays in it, and closing it gives focus back to its button.
  useFocusReturn(bulkOpen ? "bulk-open" : null);
  const bulkKey = bulkOpen
    ? `${base}/bulk-approve?${query}${include.length ? `&include=${include.join(",")}` : ""}`
    : null;
  const preview = useSWR<BulkPreviewResponse>(bulkKey, fetcher, { revalidateOnFocus: false, keepPreviousData: true });

  const move = (by: number) => {
    setMode(null);
    setSelected((i) => Math.max(0, Math.min(items.length - 1, i + by)));
  };

  // Keep the selected row in view as the keys move through the list.
  useEffect(() => {
    if (current) document.getElementById(`row-${current.id}`)?.scrollIntoView({ block: "nearest" });
  }, [current]);

  const nameOf = (item: QueueItem, taxonName?: string) => ({
    taxon: taxonName ?? item.commonName ?? item.scientificName ?? item.description,
    when: formatDayAndTime(item.observedAt, locale, timeZone),
    volunteer: item.volunteerName,
  });

  const decide = async (item: QueueItem, body: DecisionBody, label?: DecisionLabel) => {
    const toState: ReviewState =
      body.action === "reidentify" ? (body.approve ? "approved" : item.reviewState) : TO_STATE[body.action];
    // The version the coordinator is looking at: the detail pane may be fresher than the list.
    const shown = detail.data?.sighting.id === item.id ? detail.data.sighting.version : 0;
    const seenVersion = Math.max(item.version, shown);
    const leaves = Boolean(filters.state && filters.state !== toState);
    const done = body.action === "reidentify" && body.approve ? "reidentifyApprove" : body.action;
    const name = nameOf(item, label?.taxonName);
    let answer: DecisionResponse | null = null;
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
          answer = await api.send<DecisionResponse>(`${base}/sightings/${item.id}/decisions`, "POST", {
            ...body,
            version: seenVersion,
          });
          return undefined;
        },
        { optimisticData: optimistic, rollbackOnError: true, populateCache: false, revalidate: true },
      );
      const a = answer as DecisionResponse | null;
      setStatus({
        text: t(`actions.done.${done}`, name),
        undo: a ? { sightingId: item.id, reviewId: a.reviewId, version: a.sighting.version, name } : undefined,
      });
    } catch (err) {
      // Rolled back to what was shown; then reloaded, so a second try uses the current version.
      setStatus({ text: t("actions.refused", { message: refusal(err) }), bad: true });
      if (!leaves) setSelected((i) => Math.max(i - 1, 0));
      void queue.mutate();
    } finally {
      setBusy(false);
      void refreshDetail(item.id);
    }
  };

  // Undo: a new decision that puts the sighting back as it was (from the toast, or the history).
  const undo = async (sightingId: string, reviewId: number, version: number, name: RecordName) => {
    setBusy(true);
    setStatus({ text: t("actions.working") });
    try {
      await api.send(`${base}/sightings/${sightingId}/undo`, "POST", { reviewId, version });
      setStatus({ text: t("actions.done.undo", name) });
    } catch (err) {
      setStatus({ text: t("actions.refused", { message: refusal(err) }), bad: true });
    } finally {
      setBusy(false);
      await Promise.all([queue.mutate(), refreshDetail(sightingId)]);
    }
  };
  const undoToast = () => {
    const u = status?.undo;
    if (u) void undo(u.sightingId, u.reviewId, u.version, u.name);
  };

  const bulkApprove = async () => {
    const n = preview.data?.count ?? 0;
    setBulkOpen(false);
    setBusy(true);
    setStatus({ text: t("actions.working") });
    try {
      const res = await api.send<{ approved: number }>(`${base}/bulk-approve`, "POST", {
        filters: Object.fromEntries(filterParams(filters)),
        include,
        expectedCount: n,
      });
      setStatus({ text: t("actions.bulkDone", { n: res.approved }) });
    } catch (err) {
      setStatus({ text: t("actions.refused", { message: refusal(err) }), bad: true });
    } finally {
      setBusy(false);
      await queue.mutate();
    }
  };

  // The keyboard: one table (DESK_KEYS), used here and in the key list on screen.
  const onKey = useEffectEvent((e: KeyboardEvent) => {
    if (e.ctrlKey || e.metaKey || e.altKey) return;
    if (e.key === DESK_KEYS.close) {
      setMode(null);
      setBulkOpen(false);
      return;
    }
    const target = e.target as HTMLElement | null;
    if (target?.closest("input, textarea, select, [contenteditable='true'], [role='dialog'], [role='alertdialog']"))
      return;
    const [go, item, send, working] = [move, current, decide, busy];
    const key = e.key;
    if (key === DESK_KEYS.next) go(1);
    else if (key === DESK_KEYS.previous) go(-1);
    else if (key === DESK_KEYS.help) setShowKeys((v) => !v);
    else if (key === DESK_KEYS.filters) document.getElementById("f-state")?.focus();
    else if (key === DESK_KEYS.bulk) setBulkOpen(true);
    else if (key === DESK_KEYS.undo && !working && status?.undo) undoToast();
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

  const when = (v: string) => formatEventDateTime(v, locale, timeZone);
  const keyList = (Object.keys(DESK_KEYS) as DeskAction[]).map((a) => [keyLabel(a), t(`keys.${a}`)] as const);
  const tState = useTranslations("StateMark.review");
  const markName = (m: CheckMark) => t(`marks.${m}`);

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
          id="bulk-open"
          onClick={() => setBulkOpen(true)}
          aria-keyshortcuts={keyLabel("bulk")}
          disabled={busy}
        >
          {t("actions.bulk")} <kbd className="ml-2 rounded border px-1 text-xs">{keyLabel("bulk")}</kbd>
        </button>
      </div>

      {bulkOpen ? (
        <div
          role="alertdialog"
          aria-modal="true"
          aria-labelledby="bulk-question"
          onKeyDown={trapTab}
          className="rounded-lg border-2 border-heath-600 bg-heath-50 p-3"
        >
          {!preview.data ? (
            <p id="bulk-question">{t("queue.loading")}</p>
          ) : (
            <>
              <p id="bulk-question" className="font-semibold">
                {t("actions.bulkMatch", { n: preview.data.matching })}{" "}
                {preview.data.leftOut || include.length ? t("actions.bulkLeftOut", { n: preview.data.leftOut }) : null}
              </p>
              {preview.data.marks.length ? (
                <fieldset className="mt-2">
                  <legend className="sr-only">{t("filters.mark")}</legend>
                  <ul className="space-y-1 text-sm">
                    {preview.data.marks.map(({ mark, n }) => (
                      <li key={mark} className="flex flex-wrap items-center gap-2">
                        <input
                          id={`bulk-include-${mark}`}
                          type="checkbox"
                          className="size-5"
                          checked={include.includes(mark)}
                          onChange={(e) =>
                            setInclude((v) => (e.target.checked ? [...v, mark] : v.filter((x) => x !== mark)))
                          }
                        />
                        <label htmlFor={`bulk-include-${mark}`}>
                          {t("actions.bulkInclude", { mark: markName(mark) })}
                        </label>
                        <span className="text-ink-soft">
                          ({t("actions.bulkMarkCount", { mark: markName(mark), n })})
                        </span>
                      </li>
                    ))}
                  </ul>
                </fieldset>
              ) : null}
              {preview.data.count > 0 ? (
                <p className="mt-2">{t("actions.bulkConfirm", { n: preview.data.count })}</p>
              ) : (
                <p className="mt-2">{t("actions.bulkNone")}</p>
              )}
              <div className="mt-2 flex flex-wrap gap-2">
                {preview.data.count > 0 ? (
                  <button
                    type="button"
                    autoFocus
                    disabled={preview.isValidating}
                    className="inline-flex min-h-touch items-center rounded-lg bg-reed-700 px-4 font-semibold text-paper disabled:opacity-60"
                    onClick={() => void bulkApprove()}
                  >
                    {t("actions.bulkYes", { n: preview.data.count })}
                  </button>
                ) : null}
                <button
                  type="button"
                  autoFocus={preview.data.count === 0}
                  className={secondaryButtonClass}
                  onClick={() => setBulkOpen(false)}
                >
                  {t("actions.cancel")}
                </button>
              </div>
            </>
          )}
        </div>
      ) : null}

      <div
        role="status"
        aria-live="polite"
        className={`flex min-h-6 flex-wrap items-center gap-3 text-sm font-semibold ${status?.bad ? "text-signal" : "text-reed-800"}`}
      >
        <span>{status?.text ?? ""}</span>
        {status?.undo ? (
          <button
            type="button"
            disabled={busy}
            aria-keyshortcuts={keyLabel("undo")}
            className={secondaryButtonClass}
            onClick={undoToast}
          >
            {t("actions.undo")} <kbd className="ml-2 rounded border px-1 text-xs">{keyLabel("undo")}</kbd>
          </button>
        ) : null}
      </div>

      <div className="grid gap-4 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
        <section aria-labelledby="queue-title" className={`min-w-0 ${current ? "max-lg:hidden" : ""}`}>
          <a
            href="#decision-buttons"
            className="sr-only focus:not-sr-only focus:inline-block focus:rounded focus:bg-white focus:p-2 focus:font-semibold"
          >
            {t("queue.skip")}
          </a>
          <h2 id="queue-title" className="sr-only">
            {t("queue.title")}
          </h2>
          {/* A fixed height on wide screens: the queue arrives after the page and would push what is below (layout shift). */}
          <div className="max-h-[70vh] overflow-auto rounded-lg border border-reed-200 bg-white/70 lg:h-[70vh]">
            <table className="w-full border-collapse text-sm" aria-label={t("queue.title")}>
              <thead className="sticky top-0 bg-paper-deep text-start">
                <tr>
                  <th scope="col" className="p-2">
                    {t("queue.observed")}
                  </th>
                  <th scope="col" className="p-2">
                    {t("queue.taxon")}
                  </th>
                  <th scope="col" className="p-2 text-right max-sm:hidden">
                    {t("queue.count")}
                  </th>
                  <th scope="col" className="p-2 max-sm:hidden">
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
                    aria-label={t("queue.rowLabel", {
                      taxon: item.commonName ?? item.scientificName ?? t("queue.unidentified"),
                      count: item.countIsEstimate ? t("queue.about", { count: item.count }) : String(item.count),
                      volunteer: item.volunteerName,
                      when: when(item.observedAt),
                      state: tState(item.reviewState),
                    })}
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
                      <span className="block text-xs sm:hidden">
                        ×{item.countIsEstimate ? t("queue.about", { count: item.count }) : item.count} ·{" "}
                        {item.volunteerName}
                      </span>
                      <MarkChips marks={item.checkMarks} />
                    </td>
                    <td className="p-2 text-right tabular-nums max-sm:hidden">
                      {item.countIsEstimate ? t("queue.about", { count: item.count }) : item.count}
                    </td>
                    <td className="p-2 max-sm:hidden">{item.volunteerName}</td>
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
          className={`min-w-0 space-y-3 rounded-lg border border-reed-200 bg-white/70 p-3 ${current ? "" : "max-lg:hidden"}`}
        >
          {current ? (
            <>
              <button
                type="button"
                className={`${secondaryButtonClass} lg:hidden`}
                onClick={() => {
                  const id = current.id;
                  setSelected(-1);
                  setMode(null);
                  requestAnimationFrame(() => document.getElementById(`row-${id}`)?.querySelector("button")?.focus());
                }}
              >
                ← {t("queue.back")}
              </button>
              <DecisionPanel
                key={current.id}
                item={current}
                mode={mode}
                setMode={setMode}
                reasons={props.reasons}
                eventId={eventId}
                busy={busy}
                onDecide={(body, label) => void decide(current, body, label)}
              />
              {detail.data && detail.data.sighting.id === current.id ? (
                <DetailPane
                  detail={detail.data}
                  timeZone={timeZone}
                  eventId={eventId}
                  busy={busy}
                  onUndo={(reviewId) => {
                    const d = detail.data!;
                    void undo(d.sighting.id, reviewId, d.sighting.version, nameOf(current));
                  }}
                />
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
        // Hidden on touch screens, where there is no keyboard to press them.
        <aside
          aria-labelledby="keys-title"
          className="rounded-lg border border-reed-200 bg-paper-deep p-3 text-sm [@media(hover:none)]:hidden"
        >
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
