"use client";

import { useTranslations } from "next-intl";
import type { ReactNode } from "react";
import type { DeviceState, ReviewState } from "@/lib/domain";

// State marks (design.md "Words"): one icon, one colour and one word per review state and
// per device state, the same on the review desk, the field log and the live board. No
// icon serves both a review state and a device state, and the word is always shown, so
// meaning never rests on colour. Icons are our own 16 × 16 drawings, in currentColor.

type Look = { icon: ReactNode; cls: string };

const stroke = {
  fill: "none",
  stroke: "currentColor",
  strokeWidth: 1.8,
  strokeLinecap: "round",
  strokeLinejoin: "round",
} as const;

export const REVIEW_MARKS: Record<ReviewState, Look> = {
  // An hourglass: waiting for a reviewer.
  pending: {
    icon: <path {...stroke} d="M4 2h8M4 14h8M5 2c0 4 6 4 6 6s-6 2-6 6M11 2c0 4-6 4-6 6s6 2 6 6" />,
    cls: "border-heath-600 bg-heath-50 text-heath-900",
  },
  // A tick inside a circle: accepted.
  approved: {
    icon: (
      <>
        <circle {...stroke} cx="8" cy="8" r="6.2" />
        <path {...stroke} d="M5 8.3l2 2 4-4.3" />
      </>
    ),
    cls: "border-reed-700 bg-reed-100 text-reed-900",
  },
  // A circle struck through: refused by the server.
  rejected: {
    icon: (
      <>
        <circle {...stroke} cx="8" cy="8" r="6.2" />
        <path {...stroke} d="M3.7 12.3l8.6-8.6" />
      </>
    ),
    cls: "border-signal bg-signal-soft text-signal",
  },
  // A speech bubble: sent back with a question.
  returned: {
    icon: <path {...stroke} d="M2.5 3.5h11v7h-6l-3 3v-3h-2z" />,
    cls: "border-ink-soft bg-paper-deep text-ink",
  },
};

export const DEVICE_MARKS: Record<DeviceState, Look> = {
  // A clock: in the phone's outbox, to be sent.
  waiting: {
    icon: (
      <>
        <circle {...stroke} cx="8" cy="8" r="6.2" />
        <path {...stroke} d="M8 4.5V8l2.5 1.5" />
      </>
    ),
    cls: "border-ink-soft bg-white text-ink",
  },
  // An arrow leaving a tray: on its way.
  sending: {
    icon: <path {...stroke} d="M8 10V2.5M5 5.5l3-3 3 3M2.5 9.5v4h11v-4" />,
    cls: "border-reed-500 bg-reed-50 text-reed-900",
  },
  // A tray holding a filled square: the server has it.
  sent: {
    icon: (
      <>
        <path {...stroke} d="M2.5 9.5v4h11v-4" />
        <rect x="5.5" y="4" width="5" height="5" rx="0.5" fill="currentColor" />
      </>
    ),
    cls: "border-reed-700 bg-reed-50 text-reed-900",
  },
  // A warning triangle: the server refused it (its reason is shown beside).
  failed: {
    icon: (
      <>
        <path {...stroke} d="M8 2L14.5 13.5h-13z" />
        <path {...stroke} d="M8 6.5v3.2M8 11.7v.1" />
      </>
    ),
    cls: "border-signal bg-signal-soft text-signal",
  },
};

const base = "inline-flex items-center gap-1 whitespace-nowrap rounded-full border-2 font-semibold";
const sizes = { small: "px-1.5 py-0.5 text-xs", large: "px-2 py-0.5 text-sm" } as const;

function Mark({ look, word, size }: { look: Look; word: string; size: keyof typeof sizes }) {
  return (
    <span className={`${base} ${sizes[size]} ${look.cls}`}>
      <svg viewBox="0 0 16 16" width="1em" height="1em" aria-hidden="true" focusable="false">
        {look.icon}
      </svg>
      {word}
    </span>
  );
}

export function ReviewStateMark({ state, size = "small" }: { state: ReviewState; size?: keyof typeof sizes }) {
  const t = useTranslations("StateMark.review");
  return <Mark look={REVIEW_MARKS[state]} word={t(state)} size={size} />;
}

export function DeviceStateMark({ state, size = "large" }: { state: DeviceState; size?: keyof typeof sizes }) {
  const t = useTranslations("StateMark.device");
  return <Mark look={DEVICE_MARKS[state]} word={t(state)} size={size} />;
}
