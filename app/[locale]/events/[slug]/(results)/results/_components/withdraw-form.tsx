"use client";

import { useRouter } from "next/navigation";
import { useId, useState } from "react";
import { api, ApiClientError } from "@/lib/http/client";

type Labels = { open: string; reason: string; hint: string; confirm: string; done: string };

/** Withdraws one published version with a reason (shown on its public page); the version stays readable. */
export function WithdrawForm({ eventId, version, ...l }: { eventId: string; version: number } & Labels) {
  const router = useRouter();
  const id = useId();
  const [reason, setReason] = useState("");
  const [state, setState] = useState<{ busy: boolean; message: string; failed: boolean }>({
    busy: false,
    message: "",
    failed: false,
  });
  async function submit(e: React.FormEvent) {
    e.preventDefault();
    setState({ busy: true, message: "", failed: false });
    try {
      await api.send(`/api/events/${eventId}/reports/${version}/withdraw`, "POST", { reason });
    } catch (err) {
      if (!(err instanceof ApiClientError)) throw err;
      setState({ busy: false, message: err.fields[0]?.message || err.message, failed: true });
      return;
    }
    setState({ busy: false, message: l.done, failed: false });
    router.refresh();
  }
  return (
    <details className="mt-2">
      <summary className="min-h-touch cursor-pointer font-semibold text-signal">{l.open}</summary>
      <form onSubmit={submit} className="mt-2 space-y-2" noValidate>
        <label htmlFor={`${id}-reason`} className="block font-semibold">
          {l.reason}
        </label>
        <textarea
          id={`${id}-reason`}
          value={reason}
          onChange={(e) => setReason(e.target.value)}
          aria-describedby={`${id}-hint`}
          maxLength={1000}
          rows={3}
          className="w-full max-w-prose rounded-lg border-2 border-reed-300 p-2"
        />
        <p id={`${id}-hint`} className="text-sm text-ink-soft">
          {l.hint}
        </p>
        <button
          type="submit"
          disabled={state.busy}
          className="min-h-touch rounded-lg bg-signal px-5 font-semibold text-white disabled:opacity-60"
        >
          {l.confirm}
        </button>
        <p role={state.failed ? "alert" : "status"} className="font-semibold">
          {state.message}
        </p>
      </form>
    </details>
  );
}
