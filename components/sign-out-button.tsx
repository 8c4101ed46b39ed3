"use client";

import { useState, type ComponentType } from "react";

type Flow = { Dialog: ComponentType<{ waiting: number }>; waiting: number; press: number };

/**
 * The header's sign-out button. Its flow (components/sign-out-flow.tsx: the phone's unsent
 * records, the dialog, next-auth's sign-out) is fetched when the button is pressed, so a page's
 * first load carries only this button (issue 18). Texts come translated from the server.
 */
export function SignOutButton({ label, locale }: { label: string; locale: string }) {
  const [flow, setFlow] = useState<Flow | null>(null);
  const press = async () => {
    const m = await import("./sign-out-flow");
    const waiting = await m.waitingNow();
    if (waiting === 0) return m.finishSignOut(locale);
    setFlow((f) => ({ Dialog: m.SignOutFlow, waiting, press: (f?.press ?? 0) + 1 }));
  };
  return (
    <>
      <button
        type="button"
        onClick={() => void press()}
        className="min-h-touch rounded-md px-2 font-semibold underline-offset-4 hover:underline"
      >
        {label}
      </button>
      {flow ? <flow.Dialog key={flow.press} waiting={flow.waiting} /> : null}
    </>
  );
}
