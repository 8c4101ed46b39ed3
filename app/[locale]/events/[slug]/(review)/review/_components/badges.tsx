"use client";

import { useTranslations } from "next-intl";
import type { CheckMark, ReviewState } from "@/lib/domain";

// Review states are told apart by word and icon as well as colour (design.md, "Look and feel").
const STATE_LOOK: Record<ReviewState, { icon: string; cls: string }> = {
  pending: { icon: "◷", cls: "border-heath-600 bg-heath-50 text-heath-900" },
  approved: { icon: "✓", cls: "border-reed-600 bg-reed-50 text-reed-900" },
  rejected: { icon: "✕", cls: "border-signal bg-signal-soft text-signal" },
  returned: { icon: "↩", cls: "border-ink-soft bg-paper-deep text-ink" },
};

export function StateBadge({ state }: { state: ReviewState }) {
  const t = useTranslations("ReviewDesk.states");
  const look = STATE_LOOK[state];
  return (
    <span className={`inline-flex items-center gap-1 whitespace-nowrap rounded border px-1.5 py-0.5 text-xs font-semibold ${look.cls}`}>
      <span aria-hidden="true">{look.icon}</span>
      {t(state)}
    </span>
  );
}

const MARK_ICON: Record<CheckMark, string> = {
  outside_area: "⌖", outside_dates: "◴", high_count: "▲", not_on_list: "?", sensitive_taxon: "◆", photo_missing: "▢", possible_duplicate: "≈", poor_accuracy: "◎",
};

export function MarkChips({ marks }: { marks: CheckMark[] }) {
  const t = useTranslations("ReviewDesk.marks");
  if (!marks.length) return null;
  return (
    <ul className="flex flex-wrap gap-1">
      {marks.map((m) => (
        <li key={m} className="inline-flex items-center gap-1 rounded-full border border-heath-500 bg-heath-50 px-2 text-xs text-heath-900">
          <span aria-hidden="true">{MARK_ICON[m]}</span>
          {t(m)}
        </li>
      ))}
    </ul>
  );
}
