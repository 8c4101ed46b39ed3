import { getFormatter, getTranslations } from "next-intl/server";
import type { Block } from "@/lib/results/compute";
import { METHOD_NOTES, type MethodKey } from "@/lib/results/methods";

type Row = { key: MethodKey; value: number; lower?: number; upper?: number; digits?: number; percent?: boolean };

function rowsOf(b: Block): Row[] {
  const a = b.abundance;
  const rows: Row[] = [
    { key: "observed", value: a.observed },
    { key: "individuals", value: a.individuals },
    { key: "chao1", value: a.chao1.estimate, lower: a.chao1.lower, upper: a.chao1.upper, digits: 1 },
    { key: "ace", value: a.ace.estimate, lower: a.ace.lower, upper: a.ace.upper, digits: 1 },
  ];
  const i = b.incidence;
  if (i && i.units > 0) {
    rows.push(
      { key: "chao2", value: i.chao2.estimate, lower: i.chao2.lower, upper: i.chao2.upper, digits: 1 },
      { key: "ice", value: i.ice.estimate, lower: i.ice.lower, upper: i.ice.upper, digits: 1 },
      { key: "jack1", value: i.jack1.estimate, lower: i.jack1.lower, upper: i.jack1.upper, digits: 1 },
      { key: "jack2", value: i.jack2.estimate, lower: i.jack2.lower, upper: i.jack2.upper, digits: 1 },
    );
  }
  rows.push(
    { key: "coverage", value: a.coverage, percent: true },
    { key: "hill0", value: a.hill.q0.estimate, lower: a.hill.q0.lower, upper: a.hill.q0.upper, digits: 1 },
    { key: "hill1", value: a.hill.q1.estimate, lower: a.hill.q1.lower, upper: a.hill.q1.upper, digits: 1 },
    { key: "hill2", value: a.hill.q2.estimate, lower: a.hill.q2.lower, upper: a.hill.q2.upper, digits: 1 },
    { key: "shannon", value: a.shannon, digits: 3 },
    { key: "simpson", value: a.simpson, digits: 3 },
    { key: "evenness", value: a.evenness, digits: 3 },
  );
  return rows;
}

/** Every number of a block beside its method's published name and a note on how to read it. */
export async function StatsTable({ block, caption, sessions }: { block: Block; caption: string; sessions: number }) {
  const [t, format] = await Promise.all([getTranslations("Results"), getFormatter()]);
  const name = new Map(METHOD_NOTES.map((m) => [m.key, m.name]));
  const num = (v: number | null | undefined, digits = 0, percent = false) =>
    v === null || v === undefined || !Number.isFinite(v)
      ? t("undefinedValue")
      : percent
        ? format.number(v, { style: "percent", maximumFractionDigits: 1 })
        : format.number(v, { maximumFractionDigits: digits });
  return (
    <table className="w-full text-start text-sm">
      <caption className="text-start font-semibold">{caption}</caption>
      <thead>
        <tr className="border-b-2 border-reed-300">
          <th scope="col" className="py-1 pe-3">
            {t("col.method")}
          </th>
          <th scope="col" className="py-1 pe-3 text-end">
            {t("col.value")}
          </th>
          <th scope="col" className="py-1 pe-3 text-end">
            {t("col.interval")}
          </th>
          <th scope="col" className="py-1">
            {t("col.reading")}
          </th>
        </tr>
      </thead>
      <tbody>
        {rowsOf(block).map((r) => (
          <tr key={r.key} className="border-b border-reed-100 align-top">
            <th scope="row" className="py-1 pe-3 font-semibold">
              {name.get(r.key)}
            </th>
            <td className="py-1 pe-3 text-end tabular-nums" data-stat={r.key}>
              {num(r.value, r.digits, r.percent)}
            </td>
            <td className="py-1 pe-3 text-end tabular-nums">
              {r.lower !== undefined ? `${num(r.lower, r.digits)} – ${num(r.upper, r.digits)}` : ""}
            </td>
            <td className="py-1 text-ink-soft">{t(`notes.${r.key}`, { sessions })}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
