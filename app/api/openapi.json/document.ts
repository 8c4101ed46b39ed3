import { z } from "zod";
import { healthQuery, healthResponse } from "@/app/api/health/schema";
import { joinInput } from "@/app/api/join/schema";
import { reportFileParams } from "@/app/api/reports/[reportId]/[file]/schema";
import { sightingsPage, sightingsQuery } from "@/app/api/v1/events/[eventId]/sightings/schema";
import { resultsResponse } from "@/app/api/v1/events/[eventId]/results/schema";
import { reportsResponse } from "@/app/api/v1/events/[eventId]/reports/schema";
import { reportParams, reportResponse } from "@/app/api/v1/events/[eventId]/reports/[version]/schema";
import { eventsResponse } from "@/app/api/v1/events/schema";
import { errorBody, eventIdParams, READ_ONLY_NOTE } from "@/app/api/v1/schema";

// The OpenAPI 3.1 description of every public and token endpoint, generated from the zod
// schemas their handlers parse with (zod 4's own JSON Schema output, draft 2020-12, which is
// OpenAPI 3.1's schema dialect). Words a person reads come from messages/*.json
// ("ApiReference"), so the reference page shows them in its language; /api/openapi.json is
// in the caller's (Accept-Language).

type Json = Record<string, unknown>;
export type Text = (key: string) => string;

export const OPERATION_IDS = [
  "listEvents",
  "listSightings",
  "getResults",
  "listReports",
  "getReport",
  "health",
  "reportFile",
  "join",
  "openapi",
] as const;
export type OperationId = (typeof OPERATION_IDS)[number];

const components: Record<string, unknown> = {};

/** A zod schema as an OpenAPI 3.1 schema object; named sub-schemas (meta id) go to components. */
function schema(s: z.ZodType, io: "input" | "output" = "output"): Json {
  const out = z.toJSONSchema(s, { io, unrepresentable: "any" }) as Json;
  const defs = (out.$defs ?? {}) as Record<string, Json>;
  delete out.$defs;
  delete out.$schema;
  const fix = (v: unknown): unknown => {
    if (Array.isArray(v)) return v.map(fix);
    if (v && typeof v === "object") {
      return Object.fromEntries(
        Object.entries(v).map(([k, x]) => [
          k,
          k === "$ref" && typeof x === "string" ? x.replace("#/$defs/", "#/components/schemas/") : fix(x),
        ]),
      );
    }
    return v;
  };
  for (const [id, def] of Object.entries(defs)) components[id] = fix(def);
  // A schema that is itself named is referenced, not repeated.
  const id = (z.globalRegistry.get(s) as { id?: string } | undefined)?.id;
  if (id) {
    components[id] = fix(out);
    return { $ref: `#/components/schemas/${id}` };
  }
  return fix(out) as Json;
}

/** The parameters of one place ("path" or "query") from a strict zod object. */
function parameters(s: z.ZodType, place: "path" | "query", t: Text): Json[] {
  const js = z.toJSONSchema(s, { io: "input", unrepresentable: "any" }) as {
    properties?: Record<string, Json>;
    required?: string[];
  };
  return Object.entries(js.properties ?? {}).map(([name, p]) => {
    const { description: _d, ...rest } = p;
    return {
      name,
      in: place,
      required: place === "path" || (js.required ?? []).includes(name),
      description: t(`params.${name}`),
      schema: rest,
    };
  });
}

const json = (s: z.ZodType) => ({ "application/json": { schema: schema(s) } });

function errors(t: Text, codes: number[]): Json {
  return Object.fromEntries(
    codes.map((c) => [String(c), { description: t(`responses.${c}`), content: json(errorBody) }]),
  );
}

export function openApiDocument(t: Text, serverUrl?: string): Json {
  for (const k of Object.keys(components)) delete components[k];
  const op = (id: OperationId, extra: Json): Json => ({
    operationId: id,
    summary: t(`operations.${id}.summary`),
    description: t(`operations.${id}.description`),
    ...extra,
  });
  const token = { security: [{ apiToken: [] }], tags: ["token"] };
  const publicOp = { security: [], tags: ["public"] };
  const tokenErrors = (extra: number[] = []) => errors(t, [400, 401, 403, 404, 429, ...extra].sort());
  const eventPath = parameters(eventIdParams, "path", t);

  const paths: Record<string, Json> = {
    "/api/v1/events": {
      get: op("listEvents", {
        ...token,
        responses: {
          200: { description: t("responses.200"), content: json(eventsResponse) },
          ...errors(t, [401, 429]),
        },
      }),
    },
    "/api/v1/events/{eventId}/sightings": {
      get: op("listSightings", {
        ...token,
        parameters: [...eventPath, ...parameters(sightingsQuery, "query", t)],
        responses: {
          200: {
            description: t("responses.200"),
            headers: {
              "X-Next-Cursor": { description: t("headers.nextCursor"), schema: { type: "string" } },
              "X-Modified-Until": {
                description: t("headers.modifiedUntil"),
                schema: { type: "string", format: "date-time" },
              },
              "X-Withheld": { description: t("headers.withheld"), schema: { type: "integer" } },
            },
            content: { ...json(sightingsPage), "text/csv": { schema: { type: "string" } } },
          },
          ...tokenErrors(),
        },
      }),
    },
    "/api/v1/events/{eventId}/results": {
      get: op("getResults", {
        ...token,
        parameters: eventPath,
        responses: { 200: { description: t("responses.200"), content: json(resultsResponse) }, ...tokenErrors() },
      }),
    },
    "/api/v1/events/{eventId}/reports": {
      get: op("listReports", {
        ...token,
        parameters: eventPath,
        responses: { 200: { description: t("responses.200"), content: json(reportsResponse) }, ...tokenErrors() },
      }),
    },
    "/api/v1/events/{eventId}/reports/{version}": {
      get: op("getReport", {
        ...token,
        parameters: parameters(reportParams, "path", t),
        responses: { 200: { description: t("responses.200"), content: json(reportResponse) }, ...tokenErrors() },
      }),
    },
    "/api/health": {
      get: op("health", {
        ...publicOp,
        parameters: parameters(healthQuery, "query", t),
        responses: {
          200: { description: t("responses.200"), content: json(healthResponse) },
          503: { description: t("responses.503"), content: json(healthResponse) },
        },
      }),
    },
    "/api/reports/{reportId}/{file}": {
      get: op("reportFile", {
        ...publicOp,
        parameters: parameters(reportFileParams, "path", t),
        responses: {
          200: {
            description: t("responses.200"),
            content: {
              "text/csv": { schema: { type: "string" } },
              "application/zip": { schema: { type: "string", contentMediaType: "application/zip" } },
              "application/geo+json": { schema: { type: "object" } },
            },
          },
          ...errors(t, [404]),
        },
      }),
    },
    "/api/join": {
      post: op("join", {
        ...publicOp,
        requestBody: { required: true, content: { "application/json": { schema: schema(joinInput, "input") } } },
        responses: {
          200: {
            description: t("responses.200"),
            content: {
              "application/json": {
                schema: { type: "object", properties: { ok: { type: "boolean" }, outcome: { type: "string" } } },
              },
            },
          },
          ...errors(t, [400, 404, 422, 429]),
        },
      }),
    },
    "/api/openapi.json": {
      get: op("openapi", {
        ...publicOp,
        responses: {
          200: { description: t("responses.200"), content: { "application/json": { schema: { type: "object" } } } },
        },
      }),
    },
  };

  return {
    openapi: "3.1.0",
    info: { title: "Ecotone API", version: "1.0.0", description: `${t("info.description")} ${READ_ONLY_NOTE}` },
    ...(serverUrl ? { servers: [{ url: serverUrl }] } : {}),
    tags: [
      { name: "token", description: t("tags.token") },
      { name: "public", description: t("tags.public") },
    ],
    paths,
    components: {
      schemas: { ...components },
      securitySchemes: { apiToken: { type: "http", scheme: "bearer", description: t("security.apiToken") } },
    },
  };
}
