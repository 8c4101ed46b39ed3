"use client";

import { useTranslations } from "next-intl";
import type { CheckMark } from "@/lib/domain";

// Check marks on a sighting, each with its icon and word (review states: components/state-mark.tsx).
const MARK_ICON: Record<CheckMark, string> = {
  outside_area: "⌖",
  outside_dates: "◴",
  high_count: "▲",
  not_on_list: "?",
  sensitive_taxon: "◆",
  photo_missing: "▢",
  possible_duplicate: "≈",
  poor_accuracy: "◎",
};

export function MarkChips({ marks }: { marks: CheckMark[] }) {
  const t = useTranslations("ReviewDesk.marks");
  if (!marks.length) return null;
  return (
    <ul className="flex flex-wrap gap-1">
      {marks.map((m) => (
        <li
          key={m}
          className="inline-flex items-center gap-1 rounded-full border border-heath-500 bg-heath-50 px-2 text-xs text-heath-900"
        >
          <span aria-hidden="true">{MARK_ICON[m]}</span>
          {t(m)}
        </li>
      ))}
    </ul>
  );
}
