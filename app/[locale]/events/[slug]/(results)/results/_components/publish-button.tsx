"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { api, ApiClientError } from "@/lib/http/client";

/** "Publish": freezes the current results into a new report version. */
export function PublishButton({
  eventId,
  label,
  busyLabel,
  doneLabel,
  failedLabel,
}: {
  eventId: string;
  label: string;
  busyLabel: string;
  doneLabel: string;
  failedLabel: string;
}) {
  const router = useRouter();
  const [state, setState] = useState<{ busy: boolean; message: string }>({ busy: false, message: "" });
  async function publish() {
    setState({ busy: true, message: "" });
    try {
      const report = await api.send<{ version: number }>(`/api/events/${eventId}/reports`, "POST");
      setState({ busy: false, message: doneLabel.replace("{version}", String(report.version)) });
      router.refresh();
    } catch (err) {
      if (!(err instanceof ApiClientError)) throw err;
      setState({ busy: false, message: err.message || failedLabel });
    }
  }
  return (
    <div className="flex flex-wrap items-center gap-3">
      <button
        type="button"
        onClick={publish}
        disabled={state.busy}
        className="min-h-touch rounded-lg bg-reed-700 px-5 font-semibold text-white hover:bg-reed-800 disabled:opacity-60"
      >
        {state.busy ? busyLabel : label}
      </button>
      <p role="status" aria-live="polite">
        {state.message}
      </p>
    </div>
  );
}
