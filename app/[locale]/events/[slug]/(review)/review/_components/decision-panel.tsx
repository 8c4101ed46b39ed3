"use client";

import { useTranslations } from "next-intl";
import { useState } from "react";
import useSWR from "swr";
import type { QueueItem } from "@/db/queries/review";
import { DESK_KEYS } from "@/lib/review/decisions";
import { fetcher } from "@/lib/http/client";
import type { RejectReason } from "@/lib/domain";

export type Mode = null | "reject" | "return" | "reidentify";
export type DecisionBody =
  | { action: "approve"; message?: string }
  | { action: "reject"; reason: RejectReason; message?: string }
  | { action: "return"; message: string }
  | { action: "reidentify"; taxonId: string; message?: string };

type Props = {
  item: QueueItem;
  mode: Mode;
  setMode: (m: Mode) => void;
  reasons: RejectReason[];
  eventId: string;
  busy: boolean;
  onDecide: (body: DecisionBody) => void;
};

const btn = "inline-flex min-h-touch items-center gap-2 rounded-lg px-3 font-semibold disabled:opacity-60";
const area = "block w-full rounded border-2 border-reed-700 bg-white p-2 text-sm";

// The four decisions, each with its key; reject, return and re-identify open a short form.
export function DecisionPanel({ item, mode, setMode, reasons, eventId, busy, onDecide }: Props) {
  const t = useTranslations("ReviewDesk");
  const [reason, setReason] = useState<RejectReason>(reasons[0]!);
  const [note, setNote] = useState("");
  const [question, setQuestion] = useState("");
  const [q, setQ] = useState("");
  const taxa = useSWR<{ taxa: { id: string; scientificName: string; commonName: string | null; onList: boolean }[] }>(
    mode === "reidentify" && q.trim().length >= 2
      ? `/api/events/${eventId}/review/taxa?q=${encodeURIComponent(q.trim())}`
      : null,
    fetcher,
  );
  const kbd = (k: string) => <kbd className="rounded border border-current px-1 text-xs">{k}</kbd>;
  const message = note.trim() ? note.trim() : undefined;

  return (
    <div className="space-y-2">
      <h3 className="sr-only">{t("actions.title")}</h3>
      <div className="flex flex-wrap gap-2">
        <button
          type="button"
          disabled={busy}
          aria-keyshortcuts={DESK_KEYS.approve}
          className={`${btn} bg-reed-700 text-paper`}
          onClick={() => onDecide({ action: "approve" })}
        >
          <span aria-hidden="true">✓</span>
          {t("actions.approve")} {kbd(DESK_KEYS.approve)}
        </button>
        <button
          type="button"
          disabled={busy}
          aria-keyshortcuts={DESK_KEYS.reject}
          className={`${btn} border-2 border-signal text-signal`}
          onClick={() => setMode("reject")}
        >
          <span aria-hidden="true">✕</span>
          {t("actions.reject")} {kbd(DESK_KEYS.reject)}
        </button>
        <button
          type="button"
          disabled={busy}
          aria-keyshortcuts={DESK_KEYS.returnWithQuestion}
          className={`${btn} border-2 border-ink-soft text-ink`}
          onClick={() => setMode("return")}
        >
          <span aria-hidden="true">↩</span>
          {t("actions.return")} {kbd(DESK_KEYS.returnWithQuestion)}
        </button>
        <button
          type="button"
          disabled={busy}
          aria-keyshortcuts={DESK_KEYS.reidentify}
          className={`${btn} border-2 border-heath-700 text-heath-900`}
          onClick={() => setMode("reidentify")}
        >
          <span aria-hidden="true">⇄</span>
          {t("actions.reidentify")} {kbd(DESK_KEYS.reidentify)}
        </button>
      </div>

      {mode === "reject" ? (
        <form
          aria-label={t("actions.reject")}
          className="space-y-2 rounded border border-signal p-2"
          onSubmit={(e) => {
            e.preventDefault();
            onDecide({ action: "reject", reason, message });
          }}
        >
          <label htmlFor="d-reason" className="block text-sm font-semibold">
            {t("actions.reason")}
          </label>
          <select
            id="d-reason"
            autoFocus
            className={area}
            value={reason}
            onChange={(e) => setReason(e.target.value as RejectReason)}
          >
            {reasons.map((r) => (
              <option key={r} value={r}>
                {t(`reasons.${r}`)}
              </option>
            ))}
          </select>
          <label htmlFor="d-note" className="block text-sm font-semibold">
            {t("actions.note")}
          </label>
          <textarea
            id="d-note"
            rows={2}
            maxLength={2000}
            className={area}
            value={note}
            onChange={(e) => setNote(e.target.value)}
          />
          <FormButtons t={t} onCancel={() => setMode(null)} busy={busy} />
        </form>
      ) : null}

      {mode === "return" ? (
        <form
          aria-label={t("actions.return")}
          className="space-y-2 rounded border border-ink-soft p-2"
          onSubmit={(e) => {
            e.preventDefault();
            if (question.trim().length >= 3) onDecide({ action: "return", message: question.trim() });
          }}
        >
          <label htmlFor="d-question" className="block text-sm font-semibold">
            {t("actions.question")}
          </label>
          <textarea
            id="d-question"
            autoFocus
            required
            minLength={3}
            rows={3}
            maxLength={2000}
            className={area}
            value={question}
            onChange={(e) => setQuestion(e.target.value)}
          />
          <FormButtons t={t} onCancel={() => setMode(null)} busy={busy} />
        </form>
      ) : null}

      {mode === "reidentify" ? (
        <div
          role="group"
          aria-label={t("actions.reidentify")}
          className="space-y-2 rounded border border-heath-700 p-2"
        >
          <label htmlFor="d-taxon" className="block text-sm font-semibold">
            {t("actions.taxonSearch")}
          </label>
          <input
            id="d-taxon"
            autoFocus
            type="search"
            autoComplete="off"
            className={area}
            value={q}
            onChange={(e) => setQ(e.target.value)}
          />
          <label htmlFor="d-renote" className="block text-sm font-semibold">
            {t("actions.note")}
          </label>
          <textarea
            id="d-renote"
            rows={2}
            maxLength={2000}
            className={area}
            value={note}
            onChange={(e) => setNote(e.target.value)}
          />
          {taxa.data ? (
            taxa.data.taxa.length ? (
              <ul className="space-y-1">
                {taxa.data.taxa
                  .filter((x) => x.id !== item.taxonId)
                  .map((x) => {
                    const name = x.commonName ? `${x.commonName} (${x.scientificName})` : x.scientificName;
                    return (
                      <li key={x.id}>
                        <button
                          type="button"
                          disabled={busy}
                          className="text-start text-sm underline"
                          aria-label={t("actions.choose", { name })}
                          onClick={() => onDecide({ action: "reidentify", taxonId: x.id, message })}
                        >
                          {name}{" "}
                          <span className="text-ink-soft">
                            · {x.onList ? t("actions.onList") : t("actions.offList")}
                          </span>
                        </button>
                      </li>
                    );
                  })}
              </ul>
            ) : (
              <p className="text-sm">{t("actions.noTaxa")}</p>
            )
          ) : null}
          <button type="button" className="text-sm underline" onClick={() => setMode(null)}>
            {t("actions.cancel")}
          </button>
        </div>
      ) : null}
    </div>
  );
}

function FormButtons({
  t,
  onCancel,
  busy,
}: {
  t: ReturnType<typeof useTranslations<"ReviewDesk">>;
  onCancel: () => void;
  busy: boolean;
}) {
  return (
    <div className="flex gap-2">
      <button
        type="submit"
        disabled={busy}
        className="inline-flex min-h-touch items-center rounded-lg bg-reed-700 px-4 font-semibold text-paper"
      >
        {t("actions.submit")}
      </button>
      <button
        type="button"
        onClick={onCancel}
        className="inline-flex min-h-touch items-center rounded-lg border-2 border-reed-700 px-4 font-semibold text-reed-800"
      >
        {t("actions.cancel")}
      </button>
    </div>
  );
}
