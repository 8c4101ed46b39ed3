import { getTranslations, setRequestLocale } from "next-intl/server";
import { openApiDocument } from "@/app/api/openapi.json/document";
import { env } from "@/lib/env";
import type { Locale } from "@/lib/i18n/routing";

// The readable API reference, rendered on the server from the same OpenAPI document that
// /api/openapi.json serves, in the page's language. Nothing is fetched from elsewhere and
// no script runs (the page works under the site's Content-Security-Policy as it is).
export const dynamic = "force-dynamic";

type Param = { name: string; in: string; required: boolean; description: string; schema: Record<string, unknown> };
type Operation = {
  operationId: string;
  summary: string;
  description: string;
  security: unknown[];
  tags: string[];
  parameters?: Param[];
  requestBody?: { content: Record<string, { schema: unknown }> };
  responses: Record<string, { description: string; content?: Record<string, unknown> }>;
};

function typeOf(s: Record<string, unknown>): string {
  if (Array.isArray(s.enum)) return s.enum.join(" | ");
  const parts = [String(s.type ?? "any")];
  if (s.format) parts.push(`(${String(s.format)})`);
  if (s.default !== undefined) parts.push(`= ${String(s.default)}`);
  return parts.join(" ");
}

export default async function ApiReferencePage({ params }: { params: Promise<{ locale: Locale }> }) {
  const { locale } = await params;
  setRequestLocale(locale);
  const t = await getTranslations("ApiReference");
  const text = t as unknown as (key: string) => string;
  const doc = openApiDocument(text) as {
    paths: Record<string, Record<string, Operation>>;
    components: { schemas: Record<string, unknown> };
  };
  const base = env().APP_URL;
  const operations = Object.entries(doc.paths).flatMap(([path, methods]) =>
    Object.entries(methods).map(([method, op]) => ({ path, method, op })),
  );
  const cell = "border-t border-reed-200 p-2 align-top";

  return (
    <div className="space-y-8">
      <header className="space-y-2">
        <h1 className="text-3xl font-bold text-reed-900">{t("title")}</h1>
        <p className="max-w-prose">{t("intro", { url: "/api/openapi.json" })}</p>
        <p className="max-w-prose">{t("auth")}</p>
        <p>
          <a href="/api/openapi.json" className="font-mono underline">
            /api/openapi.json
          </a>
        </p>
      </header>
      <nav aria-label={t("title")}>
        <ul className="space-y-1">
          {operations.map(({ path, method, op }) => (
            <li key={op.operationId}>
              <a href={`#${op.operationId}`} className="underline">
                <span className="font-mono uppercase">{method}</span> <span className="font-mono">{path}</span> —{" "}
                {op.summary}
              </a>
            </li>
          ))}
        </ul>
      </nav>
      {operations.map(({ path, method, op }) => (
        <section
          key={op.operationId}
          id={op.operationId}
          aria-labelledby={`${op.operationId}-title`}
          className="space-y-3 rounded-xl border border-reed-200 bg-white/70 p-4"
        >
          <h2 id={`${op.operationId}-title`} className="text-2xl font-bold text-reed-900">
            {op.summary}
          </h2>
          <p className="font-mono">
            <span className="font-bold uppercase">{method}</span> {path}{" "}
            <span className="ml-2 rounded bg-reed-100 px-2 font-sans text-sm">
              {op.security.length ? t("needsToken") : t("public")}
            </span>
          </p>
          <p className="max-w-prose">{op.description}</p>
          {op.parameters?.length ? (
            <div className="overflow-x-auto">
              <table className="w-full text-left text-sm">
                <caption className="text-left font-semibold">{t("parameters")}</caption>
                <thead>
                  <tr>
                    <th scope="col" className="p-2">
                      {t("paramName")}
                    </th>
                    <th scope="col" className="p-2">
                      {t("paramIn")}
                    </th>
                    <th scope="col" className="p-2">
                      {t("paramType")}
                    </th>
                    <th scope="col" className="p-2">
                      {t("paramRequired")}
                    </th>
                    <th scope="col" className="p-2">
                      {t("paramDescription")}
                    </th>
                  </tr>
                </thead>
                <tbody>
                  {op.parameters.map((p) => (
                    <tr key={`${p.in}:${p.name}`}>
                      <th scope="row" className={`${cell} font-mono`}>
                        {p.name}
                      </th>
                      <td className={cell}>{p.in}</td>
                      <td className={`${cell} font-mono`}>{typeOf(p.schema)}</td>
                      <td className={cell}>{p.required ? t("yes") : t("no")}</td>
                      <td className={cell}>{p.description}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          ) : null}
          {op.requestBody ? (
            <div>
              <h3 className="font-semibold">{t("requestBody")}</h3>
              <pre className="overflow-x-auto rounded bg-reed-50 p-2 text-xs">
                {JSON.stringify(op.requestBody.content["application/json"]?.schema, null, 2)}
              </pre>
            </div>
          ) : null}
          <div>
            <h3 className="font-semibold">{t("answersTitle")}</h3>
            <ul className="text-sm">
              {Object.entries(op.responses).map(([status, r]) => (
                <li key={status}>
                  <span className="font-mono font-bold">{status}</span> {r.description}{" "}
                  {r.content ? (
                    <span className="font-mono text-ink-soft">({Object.keys(r.content).join(", ")})</span>
                  ) : null}
                </li>
              ))}
            </ul>
          </div>
          {op.security.length ? (
            <div>
              <h3 className="font-semibold">{t("example")}</h3>
              <pre className="overflow-x-auto rounded bg-reed-50 p-2 text-xs">{`curl -H "Authorization: Bearer eco_…" "${base}${path.replace("{eventId}", "<eventId>").replace("{version}", "1")}"`}</pre>
            </div>
          ) : null}
        </section>
      ))}
      <section aria-labelledby="schemas-title" className="space-y-3">
        <h2 id="schemas-title" className="text-2xl font-bold text-reed-900">
          {t("schemas")}
        </h2>
        {Object.entries(doc.components.schemas).map(([name, s]) => (
          <details key={name} id={`schema-${name}`} className="rounded border border-reed-200 p-2">
            <summary className="cursor-pointer font-mono font-semibold">{name}</summary>
            <pre className="overflow-x-auto text-xs">{JSON.stringify(s, null, 2)}</pre>
          </details>
        ))}
      </section>
    </div>
  );
}
