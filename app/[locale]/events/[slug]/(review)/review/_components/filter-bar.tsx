"use client";

import { useTranslations } from "next-intl";
import type { CheckMark, ReviewState, TaxonGroup } from "@/lib/domain";
import type { Filters } from "./desk-api";

type Props = {
  filters: Filters;
  onChange: (f: Filters) => void;
  zones: { id: string; name: string }[];
  volunteers: { id: string; name: string }[];
  groups: TaxonGroup[];
  marks: CheckMark[];
  states: ReviewState[];
};

const select = "block min-h-10 w-full rounded border-2 border-reed-700 bg-white px-2 text-sm";

// The queue's filters; every change reloads the queue from its first page.
export function FilterBar({ filters, onChange, zones, volunteers, groups, marks, states }: Props) {
  const t = useTranslations("ReviewDesk");
  const tGroup = useTranslations("TaxonGroup");
  const tState = useTranslations("StateMark.review");
  const set = (key: keyof Filters) => (e: { target: { value: string } }) =>
    onChange({ ...filters, [key]: e.target.value || undefined });
  const field = (id: string, label: string, control: React.ReactNode) => (
    <div className="min-w-0">
      <label htmlFor={id} className="block text-xs font-semibold">
        {label}
      </label>
      {control}
    </div>
  );
  return (
    <form
      aria-label={t("filters.title")}
      className="grid grid-cols-2 gap-2 rounded-lg border border-reed-200 bg-white/70 p-3 sm:grid-cols-4 lg:grid-cols-5"
      onSubmit={(e) => e.preventDefault()}
    >
      {field(
        "f-state",
        t("filters.state"),
        <select id="f-state" className={select} value={filters.state ?? ""} onChange={set("state")}>
          <option value="">{t("filters.any")}</option>
          {states.map((s) => (
            <option key={s} value={s}>
              {tState(s)}
            </option>
          ))}
        </select>,
      )}
      {field(
        "f-mark",
        t("filters.mark"),
        <select id="f-mark" className={select} value={filters.marks ?? ""} onChange={set("marks")}>
          <option value="">{t("filters.any")}</option>
          {marks.map((m) => (
            <option key={m} value={m}>
              {t(`marks.${m}`)}
            </option>
          ))}
        </select>,
      )}
      {field(
        "f-group",
        t("filters.group"),
        <select id="f-group" className={select} value={filters.group ?? ""} onChange={set("group")}>
          <option value="">{t("filters.any")}</option>
          {groups.map((g) => (
            <option key={g} value={g}>
              {tGroup(g)}
            </option>
          ))}
        </select>,
      )}
      {field(
        "f-zone",
        t("filters.zone"),
        <select id="f-zone" className={select} value={filters.zone ?? ""} onChange={set("zone")}>
          <option value="">{t("filters.any")}</option>
          {zones.map((z) => (
            <option key={z.id} value={z.id}>
              {z.name}
            </option>
          ))}
          <option value="none">{t("filters.noZone")}</option>
        </select>,
      )}
      {field(
        "f-volunteer",
        t("filters.volunteer"),
        <select id="f-volunteer" className={select} value={filters.volunteer ?? ""} onChange={set("volunteer")}>
          <option value="">{t("filters.any")}</option>
          {volunteers.map((v) => (
            <option key={v.id} value={v.id}>
              {v.name}
            </option>
          ))}
        </select>,
      )}
      {field(
        "f-from",
        t("filters.from"),
        <input id="f-from" type="date" className={select} value={filters.from ?? ""} onChange={set("from")} />,
      )}
      {field(
        "f-to",
        t("filters.to"),
        <input id="f-to" type="date" className={select} value={filters.to ?? ""} onChange={set("to")} />,
      )}
      {field(
        "f-photo",
        t("filters.photo"),
        <select id="f-photo" className={select} value={filters.photo ?? ""} onChange={set("photo")}>
          <option value="">{t("filters.any")}</option>
          <option value="yes">{t("filters.photoYes")}</option>
          <option value="no">{t("filters.photoNo")}</option>
        </select>,
      )}
      {field(
        "f-order",
        t("filters.order"),
        <select id="f-order" className={select} value={filters.order ?? "newest"} onChange={set("order")}>
          <option value="newest">{t("filters.newest")}</option>
          <option value="oldest">{t("filters.oldest")}</option>
        </select>,
      )}
      <div className="flex items-end">
        <button
          type="button"
          className="min-h-10 rounded border-2 border-reed-700 px-3 text-sm font-semibold text-reed-800"
          onClick={() => onChange({ state: "pending", order: "newest" })}
        >
          {t("filters.clear")}
        </button>
      </div>
    </form>
  );
}
