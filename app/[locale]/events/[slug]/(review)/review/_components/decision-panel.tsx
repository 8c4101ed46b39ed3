"use client";

import { useTranslations } from "next-intl";
import { useState } from "react";
import useSWR from "swr";
import { useFocusReturn } from "@/components/ui/focus";
import type { QueueItem } from "@/db/queries/review";
import { keyLabel } from "@/lib/review/decisions";
import { fetcher } from "@/lib/http/client";
import type { RejectReason } from "@/lib/domain";

export type Mode = null | "reject" | "return" | "reidentify";
export type DecisionBody =
  | { action: "approve"; message?: string }
  | { action: "reject"; reason: RejectReason; message?: string }
  | { action: "return"; message: string }
  | { action: "reidentify"; taxonId: string; approve?: boolean; message?: string };
/** The new taxon's name, for the toast. */
export type DecisionLabel = { taxonName?: string };

type Props = {
  item: QueueItem;
  mode: Mode;
  setMode: (m: Mode) => void;
  reasons: RejectReason[];
  eventId: string;
  busy: boolean;
  onDecide: (body: DecisionBody, label?: DecisionLabel) => void;
};
type TaxonOption = { id: string; scientificName: string; commonName: string | null; onList: boolean };

const btn = "inline-flex min-h-touch items-center gap-2 rounded-lg px-3 font-semibold disabled:opacity-60";
const area = "block w-full rounded border-2 border-reed-700 bg-white p-2 text-sm";

// The four decisions, each with its key; reject, return and re-identify open a short form.
export function DecisionPanel({ item, mode, setMode, reasons, eventId, busy, onDecide }: Props) {
  const t = useTranslations("ReviewDesk");
  const [reason, setReason] = useState<RejectReason>(reasons[0]!);
  const [note, setNote] = useState("");
  const [question, setQuestion] = useState("");
  const [q, setQ] = useState("");
  const [active, setActive] = useState(0);
  const [chosen, setChosen] = useState<TaxonOption | null>(null);
  const taxa = useSWR<{ taxa: TaxonOption[] }>(
    mode === "reidentify" && q.trim().length >= 2
      ? `/api/events/${eventId}/review/taxa?q=${encodeURIComponent(q.trim())}`
      : null,
    fetcher,
  );
  // A form closed without a decision (Esc, Cancel) gives focus back to the button that opened it.
  useFocusReturn(mode ? `d-open-${mode}` : null);
  const kbd = (k: string) => <kbd className="rounded border border-current px-1 text-xs">{k}</kbd>;
  const message = note.trim() ? note.trim() : undefined;
  const options = (taxa.data?.taxa ?? []).filter((x) => x.id !== item.taxonId);
  const nameOf = (x: TaxonOption) => (x.commonName ? `${x.commonName} (${x.scientificName})` : x.scientificName);
  const choose = (x: TaxonOption) => {
    setChosen(x);
    setQ(nameOf(x));
    // Next: "Re-identify and approve" (Enter), or Tab to "Re-identify" alone.
    requestAnimationFrame(() => document.getElementById("d-reidentify-approve")?.focus());
  };
  const reidentify = (approve: boolean) => {
    if (chosen) onDecide({ action: "reidentify", taxonId: chosen.id, approve, message }, { taxonName: nameOf(chosen) });
  };

  return (
    <div className="space-y-2">
      <h3 className="sr-only">{t("actions.title")}</h3>
      <div id="decision-buttons" tabIndex={-1} className="flex flex-wrap gap-2">
        <button
          type="button"
          disabled={busy}
          aria-keyshortcuts={keyLabel("approve")}
          className={`${btn} bg-reed-700 text-paper`}
          onClick={() => onDecide({ action: "approve" })}
        >
          <span aria-hidden="true">✓</span>
          {t("actions.approve")} {kbd(keyLabel("approve"))}
        </button>
        <button
          type="button"
          disabled={busy}
          aria-keyshortcuts={keyLabel("reject")}
          className={`${btn} border-2 border-signal text-signal`}
          id="d-open-reject"
          onClick={() => setMode("reject")}
        >
          <span aria-hidden="true">✕</span>
          {t("actions.reject")} {kbd(keyLabel("reject"))}
        </button>
        <button
          type="button"
          disabled={busy}
          aria-keyshortcuts={keyLabel("returnWithQuestion")}
          className={`${btn} border-2 border-ink-soft text-ink`}
          id="d-open-return"
          onClick={() => setMode("return")}
        >
          <span aria-hidden="true">↩</span>
          {t("actions.return")} {kbd(keyLabel("returnWithQuestion"))}
        </button>
        <button
          type="button"
          disabled={busy}
          aria-keyshortcuts={keyLabel("reidentify")}
          className={`${btn} border-2 border-heath-700 text-heath-900`}
          id="d-open-reidentify"
          onClick={() => setMode("reidentify")}
        >
          <span aria-hidden="true">⇄</span>
          {t("actions.reidentify")} {kbd(keyLabel("reidentify"))}
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
          {/* A combobox (WAI-ARIA pattern): arrows move through the list, Enter chooses. */}
          <input
            id="d-taxon"
            autoFocus
            type="text"
            role="combobox"
            aria-autocomplete="list"
            aria-expanded={options.length > 0 && !chosen}
            aria-controls="d-taxon-list"
            aria-activedescendant={options.length && !chosen ? `d-taxon-${options[active]?.id}` : undefined}
            aria-describedby="d-taxon-hint"
            autoComplete="off"
            className={area}
            value={q}
            onChange={(e) => {
              setQ(e.target.value);
              setActive(0);
              setChosen(null);
            }}
            onKeyDown={(e) => {
              if (!options.length || chosen) return;
              if (e.key === "ArrowDown") setActive((i) => Math.min(options.length - 1, i + 1));
              else if (e.key === "ArrowUp") setActive((i) => Math.max(0, i - 1));
              else if (e.key === "Enter" && options[active]) choose(options[active]);
              else return;
              e.preventDefault();
            }}
          />
          <p id="d-taxon-hint" className="text-xs text-ink-soft">
            {t("actions.taxonHint")}
          </p>
          {taxa.data && !chosen ? (
            options.length ? (
              <ul id="d-taxon-list" role="listbox" aria-label={t("actions.taxonResults")} className="space-y-1">
                {options.map((x, i) => (
                  <li
                    key={x.id}
                    id={`d-taxon-${x.id}`}
                    role="option"
                    aria-selected={i === active}
                    className={`cursor-pointer rounded px-2 py-1 text-sm ${i === active ? "bg-heath-100 outline outline-2 outline-heath-600" : ""}`}
                    onMouseDown={(e) => e.preventDefault()}
                    onClick={() => choose(x)}
                  >
                    {nameOf(x)}{" "}
                    <span className="text-ink-soft">· {x.onList ? t("actions.onList") : t("actions.offList")}</span>
                  </li>
                ))}
              </ul>
            ) : (
              <p className="text-sm">{t("actions.noTaxa")}</p>
            )
          ) : null}
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
          <div className="flex flex-wrap gap-2">
            <button
              id="d-reidentify-approve"
              type="button"
              disabled={busy || !chosen}
              className={`${btn} bg-reed-700 text-paper`}
              onClick={() => reidentify(true)}
            >
              {t("actions.reidentifyApprove")}
            </button>
            <button
              type="button"
              disabled={busy || !chosen}
              className={`${btn} border-2 border-heath-700 text-heath-900`}
              onClick={() => reidentify(false)}
            >
              {t("actions.reidentify")}
            </button>
            <button type="button" className="text-sm underline" onClick={() => setMode(null)}>
              {t("actions.cancel")}
            </button>
          </div>
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
