"use client";

import { useLocale, useTranslations } from "next-intl";
import { useRef, useState } from "react";
import { buttonClass, secondaryButtonClass } from "@/components/ui/field";

// The phone-clearing code (IndexedDB, the sync client) and next-auth's client are fetched when
// the button is pressed, not with every page that shows the header (issue 18).
const deviceClear = () => import("@/lib/field/device-clear");

// Signing out also empties the phone's field store (records, photos, packs), so a shared phone
// keeps nothing of the person. Records not yet sent are never dropped silently: the person is
// asked to send them now or to delete them.
export function SignOutButton() {
  const t = useTranslations("SignIn");
  const tMy = useTranslations("MyData");
  const locale = useLocale();
  const dialog = useRef<HTMLDialogElement>(null);
  const [waiting, setWaiting] = useState(0);
  const [busy, setBusy] = useState(false);
  const [notSent, setNotSent] = useState(false);

  const finish = async () => {
    await (await deviceClear()).clearDevice();
    const { signOut } = await import("next-auth/react");
    await signOut({ callbackUrl: `/${locale}` });
  };
  const start = async () => {
    const n = await deviceClear()
      .then((m) => m.waitingOnDevice())
      .catch(() => 0);
    if (n === 0) return finish();
    setWaiting(n);
    setNotSent(false);
    dialog.current?.showModal();
  };
  const sendNow = async () => {
    setBusy(true);
    const left = await deviceClear()
      .then((m) => m.sendWaitingNow())
      .catch(() => waiting);
    setBusy(false);
    if (left === 0) return finish();
    setWaiting(left);
    setNotSent(true);
  };

  return (
    <>
      <button
        type="button"
        onClick={() => void start()}
        className="min-h-touch rounded-md px-2 font-semibold underline-offset-4 hover:underline"
      >
        {t("signOut")}
      </button>
      <dialog
        ref={dialog}
        aria-labelledby="sign-out-title"
        className="max-w-md rounded-xl border-2 border-reed-600 bg-white p-4 text-ink backdrop:bg-black/40"
      >
        <h2 id="sign-out-title" className="text-xl font-bold text-reed-900">
          {t("signOut")}
        </h2>
        <p className="mt-2 font-semibold">{tMy("signOutWaiting", { count: waiting })}</p>
        <p className="mt-1 text-sm">{tMy("signOutClears")}</p>
        {notSent ? (
          <p role="alert" className="mt-2 font-semibold text-signal">
            ✕ {tMy("signOutNotSent", { count: waiting })}
          </p>
        ) : null}
        <div className="mt-4 flex flex-col gap-2">
          <button type="button" className={buttonClass} disabled={busy} onClick={() => void sendNow()}>
            {busy ? tMy("signOutSending") : tMy("signOutSend")}
          </button>
          <button type="button" className={secondaryButtonClass} disabled={busy} onClick={() => void finish()}>
            {tMy("signOutDiscard")}
          </button>
          <button
            type="button"
            className={secondaryButtonClass}
            disabled={busy}
            onClick={() => dialog.current?.close()}
          >
            {tMy("signOutCancel")}
          </button>
        </div>
      </dialog>
    </>
  );
}
