import { getFormatter, getTranslations } from "next-intl/server";
import type { Block } from "@/lib/results/compute";
import { METHOD_NOTES, type IntervalMethod, type MethodKey } from "@/lib/results/methods";
import { COMPARISON_BOOTSTRAP } from "@/lib/results/settings";
import { HILL_BOOTSTRAP_REPLICATES } from "@/lib/diversity/index";
import { ABUNDANCE_REASONS, INCIDENCE_REASONS, reasonsText } from "./reasons";

type Row = { key: MethodKey; value: number; lower?: number; upper?: number; digits?: number; percent?: boolean };

function rowsOf(b: Block): Row[] {
  const rows: Row[] = [
    { key: "observed", value: b.observed },
    { key: "individuals", value: b.individuals },
  ];
  const a = b.abundance;
  if (a) {
    // One Chao1 on every screen: the Chao-group form (also the asymptotic Hill number q = 0).
    rows.push(
      {
        key: "chao1",
        value: a.chao1Classic.estimate,
        lower: a.chao1Classic.lower,
        upper: a.chao1Classic.upper,
        digits: 1,
      },
      { key: "ace", value: a.ace.estimate, lower: a.ace.lower, upper: a.ace.upper, digits: 1 },
      { key: "coverage", value: a.coverage, percent: true },
    );
  }
  const i = b.incidence;
  if (i) {
    rows.push(
      { key: "chao2", value: i.chao2.estimate, lower: i.chao2.lower, upper: i.chao2.upper, digits: 1 },
      { key: "ice", value: i.ice.estimate, lower: i.ice.lower, upper: i.ice.upper, digits: 1 },
      { key: "jack1", value: i.jack1.estimate, lower: i.jack1.lower, upper: i.jack1.upper, digits: 1 },
      { key: "jack2", value: i.jack2.estimate, digits: 1 },
    );
  }
  if (a) {
    rows.push(
      { key: "hill1", value: a.hill.q1.estimate, lower: a.hill.q1.lower, upper: a.hill.q1.upper, digits: 1 },
      { key: "hill2", value: a.hill.q2.estimate, lower: a.hill.q2.lower, upper: a.hill.q2.upper, digits: 1 },
      { key: "shannon", value: a.shannon, digits: 3 },
      { key: "simpson", value: a.simpson, digits: 3 },
      { key: "evenness", value: a.evenness, digits: 3 },
    );
  }
  return rows;
}

const INTERVAL_KEY: Record<IntervalMethod, "logNormal" | "normal" | "bootstrap" | "deltaMethod"> = {
  "log-normal": "logNormal",
  normal: "normal",
  bootstrap: "bootstrap",
  "delta method": "deltaMethod",
};

/** Every number of a block beside its method's published name, its interval's method and a note on how to read it. */
export async function StatsTable({ block, caption, sessions }: { block: Block; caption: string; sessions: number }) {
  const [t, format] = await Promise.all([getTranslations("Results"), getFormatter()]);
  const notes = new Map(METHOD_NOTES.map((m) => [m.key as MethodKey, m]));
  const num = (v: number | null | undefined, digits = 0, percent = false) =>
    v === null || v === undefined || !Number.isFinite(v)
      ? t("undefinedValue")
      : percent
        ? format.number(v, { style: "percent", maximumFractionDigits: 1 })
        : format.number(v, { maximumFractionDigits: digits });
  const abundanceWhy = block.reasons.filter((r) => ABUNDANCE_REASONS.includes(r));
  const incidenceWhy = block.reasons.filter((r) => INCIDENCE_REASONS.includes(r));
  const intervalName = (m: IntervalMethod) =>
    t(`interval.${INTERVAL_KEY[m]}`, {
      replicates: m === "bootstrap" ? HILL_BOOTSTRAP_REPLICATES : COMPARISON_BOOTSTRAP.replicates,
    });
  return (
    <div className="space-y-2">
      {block.tooFew ? (
        <p
          role="note"
          className="rounded-lg border-2 border-signal bg-signal-soft p-2 font-semibold"
          data-testid="too-few"
        >
          {t("tooFew.title")}: {t("tooFew.body", { reasons: reasonsText(t, block.reasons, block) })}
        </p>
      ) : (
        <>
          {!block.abundance ? (
            <p role="note" className="text-sm">
              {t("tooFew.abundanceWithheld", { reasons: reasonsText(t, abundanceWhy, block) })}
            </p>
          ) : null}
          {!block.incidence ? (
            <p role="note" className="text-sm">
              {t("tooFew.incidenceWithheld", { reasons: reasonsText(t, incidenceWhy, block) })}
            </p>
          ) : null}
        </>
      )}
      {block.leftOut.taxa > 0 ? (
        <p className="text-sm">{t("leftOut", { taxa: block.leftOut.taxa, individuals: block.leftOut.individuals })}</p>
      ) : null}
      {block.folded > 0 ? <p className="text-sm">{t("folded", { folded: block.folded })}</p> : null}
      <table className="w-full text-left text-sm">
        <caption className="text-left font-semibold">{caption}</caption>
        <thead>
          <tr className="border-b-2 border-reed-300">
            <th scope="col" className="py-1 pr-3">
              {t("col.method")}
            </th>
            <th scope="col" className="py-1 pr-3 text-right">
              {t("col.value")}
            </th>
            <th scope="col" className="py-1 pr-3 text-right">
              {t("col.interval")}
            </th>
            <th scope="col" className="py-1">
              {t("col.reading")}
            </th>
          </tr>
        </thead>
        <tbody>
          {rowsOf(block).map((r) => {
            const m = notes.get(r.key)!;
            return (
              <tr key={r.key} className="border-b border-reed-100 align-top">
                <th scope="row" className="py-1 pr-3 font-semibold">
                  {m.name}
                </th>
                <td className="py-1 pr-3 text-right tabular-nums" data-stat={r.key}>
                  {num(r.value, r.digits, r.percent)}
                </td>
                <td className="py-1 pr-3 text-right tabular-nums">
                  {r.lower !== undefined && m.interval ? (
                    <>
                      {`${num(r.lower, r.digits)} – ${num(r.upper, r.digits)}`}{" "}
                      <span className="block text-xs text-ink-soft">{intervalName(m.interval)}</span>
                    </>
                  ) : (
                    ""
                  )}
                </td>
                <td className="py-1 text-ink-soft">{t(`notes.${r.key}`, { sessions })}</td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
