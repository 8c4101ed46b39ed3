"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";

/** "Publish": freezes the current results into a new report version. */
export function PublishButton({ eventId, label, busyLabel, doneLabel, failedLabel }: { eventId: string; label: string; busyLabel: string; doneLabel: string; failedLabel: string }) {
  const router = useRouter();
  const [state, setState] = useState<{ busy: boolean; message: string }>({ busy: false, message: "" });
  async function publish() {
    setState({ busy: true, message: "" });
    const res = await fetch(`/api/events/${eventId}/reports`, { method: "POST" });
    if (res.ok) {
      const body = (await res.json()) as { version: number };
      setState({ busy: false, message: doneLabel.replace("{version}", String(body.version)) });
      router.refresh();
    } else {
      const body = (await res.json().catch(() => null)) as { error?: { message?: string } } | null;
      setState({ busy: false, message: body?.error?.message ?? failedLabel });
    }
  }
  return (
    <div className="flex flex-wrap items-center gap-3">
      <button type="button" onClick={publish} disabled={state.busy}
        className="min-h-touch rounded-lg bg-reed-700 px-5 font-semibold text-white hover:bg-reed-800 disabled:opacity-60">
        {state.busy ? busyLabel : label}
      </button>
      <p role="status" aria-live="polite">{state.message}</p>
    </div>
  );
}
