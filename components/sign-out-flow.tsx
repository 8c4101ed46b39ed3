"use client";

import { useLocale, useTranslations } from "next-intl";
import { useEffect, useRef, useState } from "react";
import { buttonClass, secondaryButtonClass } from "@/components/ui/field";

// The phone-clearing code (IndexedDB, the sync client) and next-auth's client are fetched when
// the button is pressed, not with every page that shows the header (issue 18).
const deviceClear = () => import("@/lib/field/device-clear");

// Signing out also empties the phone's field store (records, photos, packs), so a shared phone
// keeps nothing of the person. Records not yet sent are never dropped silently: the person is
// asked to send them now or to delete them. Mounted by the header's sign-out button (sign-out-button.tsx)
// each time it is pressed; this module loads then, not with the page.
/** Empties the phone's field store and signs out. */
export async function finishSignOut(locale: string) {
  await (await deviceClear()).clearDevice();
  const { signOut } = await import("next-auth/react");
  await signOut({ callbackUrl: `/${locale}` });
}

/** How many records on this phone are not sent yet (0 when the store cannot be read). */
export function waitingNow(): Promise<number> {
  return deviceClear()
    .then((m) => m.waitingOnDevice())
    .catch(() => 0);
}

/** The dialog shown when records are waiting: send them now, delete them, or stay signed in. */
export function SignOutFlow({ waiting: waitingAtPress }: { waiting: number }) {
  const t = useTranslations("SignIn");
  const tMy = useTranslations("MyData");
  const locale = useLocale();
  const dialog = useRef<HTMLDialogElement>(null);
  const [waiting, setWaiting] = useState(waitingAtPress);
  const [busy, setBusy] = useState(false);
  const [notSent, setNotSent] = useState(false);

  const finish = () => finishSignOut(locale);
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

  // Mounted anew at each press that finds records waiting: open the dialog at once.
  useEffect(() => {
    dialog.current?.showModal();
  }, []);

  return (
    <>
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
