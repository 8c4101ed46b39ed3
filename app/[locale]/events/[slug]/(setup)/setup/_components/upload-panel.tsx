"use client";

import { useTranslations } from "next-intl";
import { useState, type ReactNode } from "react";
import { buttonClass } from "@/components/ui/field";
import { api, ApiClientError } from "@/lib/http/client";
import type { ReportLine, UploadReport } from "@/server/setup/upload-report";
import { ReportTable } from "./report-table";

// The upload half of a setup screen (area and zones, species list): pick a file, have the
// server check it (`save: false`), read the report or the summary, then save it. The
// handler answers 200 with a summary, or 422 with a report line per problem.

/** The handler's answer to a file it accepts: checked (`saved: false`) or stored. */
export type UploadAnswer<S> = { ok: true; saved: boolean; summary: S; report: [] };
type Shown<A> = { report: ReportLine[] } | { report: []; checked: A };

type Props<C, S, A extends UploadAnswer<S>> = {
  /** "zones" or "species" (the message namespace under Setup), or "paper" (PaperSheets.upload); also the ids of the form. */
  kind: "zones" | "species" | "paper";
  url: string;
  accept: string;
  /** The file's content as the handler takes it, or a report line when it cannot even be read. */
  read: (text: string) => { content: C } | { problem: ReportLine };
  body: (content: C, save: boolean) => unknown;
  format: ReactNode;
  /** Shown under the format, before the file (the species list's note on shared taxa). */
  note?: ReactNode;
  /** What to show of a checked file's answer beyond its summary (the species list's notices). */
  checkedNote?: (answer: A) => ReactNode;
  preview?: (file: { name: string; content: C | null }, report: ReportLine[]) => ReactNode;
  onSaved: (saved: A) => void;
};

export function UploadPanel<C, S extends Record<string, number>, A extends UploadAnswer<S> = UploadAnswer<S>>(
  props: Props<C, S, A>,
) {
  const { kind, url } = props;
  const t = useTranslations((kind === "paper" ? "PaperSheets.upload" : `Setup.${kind}`) as "Setup.species");
  const [file, setFile] = useState<{ name: string; content: C | null } | null>(null);
  const [answer, setAnswer] = useState<Shown<A> | null>(null);
  const [busy, setBusy] = useState(false);
  const [done, setDone] = useState<S | null>(null);

  /** Sends the file; a refusal without a report (too large, no answer) becomes a one-line report. */
  async function put(content: C, save: boolean): Promise<A | null> {
    setBusy(true);
    const res = await api.call<A, Partial<Pick<UploadReport<S>, "report">>>(url, {
      method: "PUT",
      body: props.body(content, save),
    });
    setBusy(false);
    if (res.ok) {
      if (!save) setAnswer({ report: [], checked: res.data });
      return res.data;
    }
    setAnswer({ report: res.error.body?.report ?? [failure(res.error)] });
    return null;
  }
  const failure = (error: ApiClientError): ReportLine => ({
    feature: null,
    line: 1,
    field: "(file)",
    code: "error",
    message: error.problem || t("failed"),
  });

  async function check(name: string, text: string) {
    setDone(null);
    setAnswer(null);
    const read = props.read(text);
    if ("problem" in read) {
      setFile({ name, content: null });
      setAnswer({ report: [read.problem] });
      return;
    }
    setFile({ name, content: read.content });
    await put(read.content, false);
  }

  async function save() {
    if (file?.content == null) return;
    const saved = await put(file.content, true);
    if (!saved?.saved) return;
    setDone(saved.summary);
    setFile(null);
    setAnswer(null);
    props.onSaved(saved);
  }

  const report = answer?.report ?? [];
  const checked = answer && "checked" in answer ? answer.checked : null;
  return (
    <section
      aria-labelledby={`${kind}-upload-title`}
      className="space-y-3 rounded-xl border border-reed-200 bg-white/70 p-4"
    >
      <h2 id={`${kind}-upload-title`} className="text-2xl font-bold text-reed-900">
        {t("uploadTitle")}
      </h2>
      <p className="max-w-prose">{t("uploadIntro")}</p>
      <details className="max-w-prose text-sm">
        <summary className="cursor-pointer font-semibold">{t("formatTitle")}</summary>
        {props.format}
      </details>
      {props.note}
      <label className="block font-semibold" htmlFor={`${kind}-file`}>
        {t("fileLabel")}
      </label>
      <input
        id={`${kind}-file`}
        type="file"
        accept={props.accept}
        className="block min-h-touch"
        onChange={async (e) => {
          const f = e.target.files?.[0];
          if (f) await check(f.name, await f.text());
          e.target.value = "";
        }}
      />
      {busy ? <p role="status">{t("checking")}</p> : null}
      {report.length ? <ReportTable report={report} kind={kind === "zones" ? "geojson" : "csv"} /> : null}
      {checked ? (
        <div role="status" className="space-y-2 rounded-lg border-2 border-reed-600 bg-reed-50 p-3">
          <p className="font-semibold">✓ {t("checkedOk", { name: file?.name ?? "", ...checked.summary })}</p>
          {props.checkedNote?.(checked)}
          <button type="button" className={buttonClass} onClick={save} disabled={busy}>
            {t("save")}
          </button>
        </div>
      ) : null}
      {file && props.preview ? props.preview(file, report) : null}
      {done ? (
        <p role="status" className="font-semibold text-reed-700">
          ✓ {t("saved", { ...done })}
        </p>
      ) : null}
    </section>
  );
}
