"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { api } from "@/lib/http/client";

type Labels = {
  label: string;
  busyLabel: string;
  doneLabel: string;
  failedLabel: string;
  confirmPending: string;
  confirm: string;
  cancel: string;
};

/**
 * "Publish": freezes the current results into a new report version. With sightings still
 * pending or returned the server answers 409 with their numbers; the button then asks,
 * and only an explicit "Publish with records pending" sends `confirmPending: true`.
 */
export function PublishButton({ eventId, ...l }: { eventId: string } & Labels) {
  const router = useRouter();
  const [state, setState] = useState<{ busy: boolean; message: string; ask: string | null }>({
    busy: false,
    message: "",
    ask: null,
  });
  async function publish(confirmPending: boolean) {
    setState({ busy: true, message: "", ask: null });
    const res = await api.call<{ version: number }, { pending?: { pending: number; returned: number } }>(
      `/api/events/${eventId}/reports`,
      { method: "POST", body: confirmPending ? { confirmPending: true } : {} },
    );
    if (res.ok) {
      setState({ busy: false, message: l.doneLabel.replace("{version}", String(res.data.version)), ask: null });
      router.refresh();
      return;
    }
    const pending = res.error.body?.pending;
    if (res.error.status === 409 && pending) {
      const ask = l.confirmPending
        .replace("{pending}", String(pending.pending))
        .replace("{returned}", String(pending.returned));
      setState({ busy: false, message: "", ask });
      return;
    }
    setState({ busy: false, message: res.error.message || l.failedLabel, ask: null });
  }
  return (
    <div className="space-y-3">
      <div className="flex flex-wrap items-center gap-3">
        <button
          type="button"
          onClick={() => publish(false)}
          disabled={state.busy}
          className="min-h-touch rounded-lg bg-reed-700 px-5 font-semibold text-white hover:bg-reed-800 disabled:opacity-60"
        >
          {state.busy ? l.busyLabel : l.label}
        </button>
        <p role="status" aria-live="polite">
          {state.message}
        </p>
      </div>
      {state.ask ? (
        <div
          role="alertdialog"
          aria-label={l.confirm}
          className="space-y-2 rounded-lg border-2 border-signal bg-signal-soft p-3"
        >
          <p>{state.ask}</p>
          <div className="flex flex-wrap gap-3">
            <button
              type="button"
              onClick={() => publish(true)}
              className="min-h-touch rounded-lg bg-signal px-5 font-semibold text-white"
            >
              {l.confirm}
            </button>
            <button
              type="button"
              onClick={() => setState({ busy: false, message: "", ask: null })}
              className="min-h-touch rounded-lg border-2 border-reed-700 px-5 font-semibold"
            >
              {l.cancel}
            </button>
          </div>
        </div>
      ) : null}
    </div>
  );
}
