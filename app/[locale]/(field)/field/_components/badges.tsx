"use client";

import { useTranslations } from "next-intl";
import type { DeviceState, ReviewState } from "@/lib/field/types";

// Device and review states, told apart by word and icon as well as colour (design.md).
const deviceLook: Record<DeviceState, { icon: string; cls: string }> = {
  waiting: { icon: "◷", cls: "border-heath-700 bg-heath-50 text-heath-900" },
  sending: { icon: "↑", cls: "border-reed-700 bg-reed-50 text-reed-900" },
  sent: { icon: "✓", cls: "border-reed-700 bg-reed-100 text-reed-900" },
  failed: { icon: "✕", cls: "border-signal bg-signal-soft text-signal" },
};
const reviewLook: Record<ReviewState, { icon: string; cls: string }> = {
  pending: { icon: "…", cls: "border-ink-soft bg-white text-ink" },
  approved: { icon: "✔", cls: "border-reed-800 bg-reed-800 text-paper" },
  rejected: { icon: "⊘", cls: "border-signal bg-white text-signal" },
  returned: { icon: "?", cls: "border-heath-700 bg-heath-100 text-heath-900" },
};

const base = "inline-flex items-center gap-1 rounded-full border-2 px-2 py-0.5 text-sm font-bold";

export function DeviceBadge({ state }: { state: DeviceState }) {
  const t = useTranslations("FieldLog.deviceState");
  const look = deviceLook[state];
  return <span className={`${base} ${look.cls}`}><span aria-hidden="true">{look.icon}</span>{t(state)}</span>;
}

export function ReviewBadge({ state }: { state: ReviewState }) {
  const t = useTranslations("FieldLog.reviewState");
  const look = reviewLook[state];
  return <span className={`${base} ${look.cls}`}><span aria-hidden="true">{look.icon}</span>{t(state)}</span>;
}
