"use client";

import { type KeyboardEvent, useEffect, useRef } from "react";

// Keyboard focus for forms and dialogs that open in place (issue 17, keyboard only).

/**
 * Returns focus to the control that opened something once it closes. `openerId` is that
 * control's id while the thing is open, null when nothing is. Focus moves only when it was
 * lost with the closed form (on the page's body), never away from where a person put it.
 */
export function useFocusReturn(openerId: string | null) {
  const last = useRef<string | null>(null);
  useEffect(() => {
    const was = last.current;
    last.current = openerId;
    if (!was || openerId) return;
    const active = document.activeElement;
    if (!active || active === document.body) document.getElementById(was)?.focus();
  }, [openerId]);
}

const FOCUSABLE =
  'a[href], button:not([disabled]), input:not([disabled]), select:not([disabled]), textarea:not([disabled]), [tabindex]:not([tabindex="-1"])';

/** A modal dialog's keydown handler: Tab and Shift+Tab go round its own controls, never out of it. */
export function trapTab(e: KeyboardEvent<HTMLElement>) {
  if (e.key !== "Tab") return;
  const items = [...e.currentTarget.querySelectorAll<HTMLElement>(FOCUSABLE)].filter(
    (el) => el.getClientRects().length,
  );
  if (!items.length) return;
  const [first, last] = [items[0]!, items[items.length - 1]!];
  const inside = e.currentTarget.contains(document.activeElement);
  if (e.shiftKey && (document.activeElement === first || !inside)) {
    e.preventDefault();
    last.focus();
  } else if (!e.shiftKey && (document.activeElement === last || !inside)) {
    e.preventDefault();
    first.focus();
  }
}
