"use client";

import { useRouter } from "next/navigation";
import { useEffect, useId, useRef, useState } from "react";
import { api, ApiClientError } from "@/lib/http/client";

type Labels = {
  publish: string;
  dialog: string;
  confirmOpen: string;
  note: string;
  noteHint: string;
  notify: string;
  confirm: string;
  cancel: string;
  busy: string;
};

/**
 * Publishing from the preview: a confirmation that repeats the records left out, takes an
 * optional note for the report page and lets the organiser hold back the participants' e-mail.
 */
export function PreviewPublish({
  eventId,
  slug,
  locale,
  open,
  labels: l,
}: {
  eventId: string;
  slug: string;
  locale: string;
  version: number;
  open: number;
  labels: Labels;
}) {
  const router = useRouter();
  const id = useId();
  const [asking, setAsking] = useState(false);
  const [note, setNote] = useState("");
  const [notify, setNotify] = useState(true);
  const [busy, setBusy] = useState(false);
  const [problem, setProblem] = useState("");
  // Keyboard users land in the confirmation when it opens and back on the button when it closes.
  const dialogRef = useRef<HTMLDivElement>(null);
  const openerRef = useRef<HTMLButtonElement>(null);
  const wasAsking = useRef(false);
  useEffect(() => {
    if (asking) dialogRef.current?.focus();
    else if (wasAsking.current) openerRef.current?.focus();
    wasAsking.current = asking;
  }, [asking]);
  async function publish() {
    setBusy(true);
    setProblem("");
    try {
      // The confirmation named the records still open, so confirming takes them as they are.
      const res = await api.send<{ version: number }>(`/api/events/${eventId}/reports`, "POST", {
        confirmPending: open > 0,
        note,
        notify,
      });
      router.push(`/${locale}/events/${slug}/reports/${res.version}`);
    } catch (err) {
      if (!(err instanceof ApiClientError)) throw err;
      setProblem(err.message);
      setBusy(false);
    }
  }
  if (!asking)
    return (
      <button
        ref={openerRef}
        type="button"
        onClick={() => setAsking(true)}
        className="min-h-touch rounded-lg bg-reed-700 px-5 font-semibold text-white hover:bg-reed-800"
      >
        {l.publish}
      </button>
    );
  return (
    <div
      ref={dialogRef}
      role="dialog"
      tabIndex={-1}
      aria-labelledby={`${id}-title`}
      onKeyDown={(e) => {
        if (e.key === "Escape" && !busy) setAsking(false);
      }}
      className="space-y-3 rounded-lg border-2 border-reed-700 bg-white p-4"
    >
      <p id={`${id}-title`} className="text-lg font-bold">
        {l.dialog}
      </p>
      {open > 0 ? <p className="font-semibold text-signal">{l.confirmOpen}</p> : null}
      <div className="space-y-1">
        <label htmlFor={`${id}-note`} className="block font-semibold">
          {l.note}
        </label>
        <textarea
          id={`${id}-note`}
          value={note}
          onChange={(e) => setNote(e.target.value)}
          maxLength={2000}
          rows={3}
          aria-describedby={`${id}-note-hint`}
          className="w-full max-w-prose rounded-lg border-2 border-reed-300 p-2"
        />
        <p id={`${id}-note-hint`} className="text-sm text-ink-soft">
          {l.noteHint}
        </p>
      </div>
      <label className="flex min-h-touch items-center gap-2">
        <input type="checkbox" checked={notify} onChange={(e) => setNotify(e.target.checked)} />
        {l.notify}
      </label>
      <div className="flex flex-wrap gap-3">
        <button
          type="button"
          onClick={publish}
          disabled={busy}
          className="min-h-touch rounded-lg bg-reed-700 px-5 font-semibold text-white disabled:opacity-60"
        >
          {busy ? l.busy : l.confirm}
        </button>
        <button
          type="button"
          onClick={() => setAsking(false)}
          className="min-h-touch rounded-lg border-2 border-reed-700 px-5 font-semibold"
        >
          {l.cancel}
        </button>
      </div>
      {problem ? (
        <p role="alert" className="font-semibold text-signal">
          {problem}
        </p>
      ) : null}
    </div>
  );
}
