import { createTranslator } from "next-intl";
import { z } from "zod";
import { env } from "@/lib/env";
import { isLocale, routing, type Locale } from "@/lib/i18n/routing";
import { catalogues, translator } from "@/lib/i18n/translator";
import { NUL_ISSUE } from "@/lib/validation/text";

// One error type for every route handler (conventions, habit 5): a code maps to an
// HTTP status and a translated message a person can act on.
export const errorStatus = {
  bad_request: 400,
  unauthenticated: 401,
  api_token_refused: 401,
  forbidden: 403,
  not_found: 404,
  method_not_allowed: 405,
  unsupported_media_type: 415,
  conflict: 409,
  unprocessable: 422,
  rate_limited: 429,
  unavailable: 503,
  internal: 500,
} as const;
export type ErrorCode = keyof typeof errorStatus;

export type FieldProblem = { field: string; message: string };

/** The body of every error answer (errorResponse writes it; lib/http/client.ts reads it). */
export type ApiErrorBody = { error: { code: ErrorCode; message: string; fields: FieldProblem[] } };

export class ApiError extends Error {
  constructor(
    readonly code: ErrorCode,
    readonly fields: FieldProblem[] = [],
    readonly values: Record<string, string | number> = {},
  ) {
    super(code);
    this.name = "ApiError";
  }
}

/** The person's language for an API answer: our locale cookie, then Accept-Language. */
export function requestLocale(request: Request): Locale {
  const cookie = request.headers.get("cookie")?.match(/(?:^|;\s*)NEXT_LOCALE=([a-z]{2})/)?.[1];
  if (cookie && isLocale(cookie)) return cookie;
  const accepted = request.headers.get("accept-language") ?? "";
  for (const part of accepted.split(",")) {
    const tag = part.trim().slice(0, 2).toLowerCase();
    if (isLocale(tag)) return tag;
  }
  return routing.defaultLocale;
}

export function apiTranslator(locale: Locale) {
  return translator(locale, "ApiErrors");
}

type Catalogue = (typeof catalogues)["en"];
/** A namespace of message keys that schemas may use as their zod messages, e.g. "Setup.errors". */
export type MessageKeys = {
  [N in keyof Catalogue & string]: {
    [M in keyof Catalogue[N] & string]: Catalogue[N][M] extends Record<string, string> ? `${N}.${M}` : never;
  }[keyof Catalogue[N] & string];
}[keyof Catalogue & string];

function keyedMessage(namespace: MessageKeys | undefined, message: string, locale: Locale): string | null {
  if (!namespace) return null;
  const [top, sub] = namespace.split(".") as [keyof Catalogue, string];
  const keys = (catalogues.en[top] as Record<string, Record<string, string>>)[sub];
  if (!keys || !Object.hasOwn(keys, message)) return null;
  return createTranslator({ locale, messages: catalogues[locale], namespace: namespace as never })(message as never);
}

type Expected = "int" | "number" | "boolean" | "string" | "array" | "object";
const EXPECTED = new Set<string>(["int", "number", "boolean", "string", "array", "object"]);

/**
 * A refused input as an ApiError: 422 when a value of the right type holds a character that
 * cannot be stored (NUL), 400 for every other shape problem; each problem names its field.
 */
export function zodApiError(error: z.ZodError, locale: Locale, messages?: MessageKeys): ApiError {
  const code = error.issues.some((i) => i.code === "custom" && i.message === NUL_ISSUE)
    ? "unprocessable"
    : "bad_request";
  return new ApiError(code, zodFieldProblems(error, locale, messages));
}

/**
 * Field problems from a zod error, in the person's language, naming the field. A schema
 * shared with a form may give its issues message keys of one namespace (`messages`, e.g.
 * "Setup.errors"): those are translated as they are; any other issue gets the general text.
 */
export function zodFieldProblems(error: z.ZodError, locale: Locale, messages?: MessageKeys): FieldProblem[] {
  const t = apiTranslator(locale);
  return error.issues.map((issue) => {
    const at = issue.path.map(String);
    // An unknown key is named as the field itself, so the caller sees which one to drop.
    const field =
      issue.code === "unrecognized_keys"
        ? [...at, issue.keys.join(",")].join(".")
        : at.length
          ? at.join(".")
          : "(body)";
    const keyed = keyedMessage(messages, issue.message, locale);
    if (keyed !== null) return { field, message: keyed };
    let message: string;
    switch (issue.code) {
      case "invalid_type": {
        // Zod 4 leaves the input out of its issues; its own message still says what arrived.
        const received =
          "input" in issue
            ? issue.input === null
              ? "null"
              : typeof issue.input
            : /received (\w+)/.exec(issue.message)?.[1];
        const expected = String(issue.expected);
        message =
          received === "undefined"
            ? t("field.required")
            : EXPECTED.has(expected)
              ? t(`field.expected.${expected as Expected}`)
              : t("field.wrongType", { expected });
        break;
      }
      case "too_small":
        message = t("field.tooSmall", { minimum: String(issue.minimum) });
        break;
      case "too_big":
        message = t("field.tooBig", { maximum: String(issue.maximum) });
        break;
      case "unrecognized_keys":
        message = t("field.unknownKeys", { keys: issue.keys.join(", ") });
        break;
      case "invalid_value":
        message = t("field.notAllowed", { allowed: issue.values.map(String).join(", ") });
        break;
      case "custom":
        message = issue.message === NUL_ISSUE ? t("field.invalidChar") : t("field.invalid");
        break;
      default:
        message = t("field.invalid");
    }
    return { field, message };
  });
}

export function errorResponse(error: ApiError, locale: Locale): Response {
  const t = apiTranslator(locale);
  const body: ApiErrorBody = {
    error: { code: error.code, message: t(`code.${error.code}`, error.values), fields: error.fields },
  };
  return Response.json(body, { status: errorStatus[error.code], headers: { "Cache-Control": "no-store" } });
}

/**
 * Wraps a route handler: ApiErrors become their JSON answer; anything else is logged
 * and answered with a plain 500 that shows no internals.
 */
export function handle<Ctx>(fn: (request: Request, ctx: Ctx) => Promise<Response>) {
  return async (request: Request, ctx: Ctx): Promise<Response> => {
    const locale = requestLocale(request);
    try {
      assertSameOrigin(request);
      return await fn(request, ctx);
    } catch (err) {
      if (err instanceof ApiError) return errorResponse(err, locale);
      if (err instanceof z.ZodError) return errorResponse(zodApiError(err, locale), locale);
      console.error("[api] unhandled error", request.method, new URL(request.url).pathname, err);
      return errorResponse(new ApiError("internal"), locale);
    }
  };
}

const SAFE_METHODS = new Set(["GET", "HEAD", "OPTIONS"]);

/**
 * State-changing calls must come from our own pages: a browser always sends Origin on
 * them, and Sec-Fetch-Site where it knows. A cross-site request is refused before any
 * handler code runs (on top of SameSite cookies). Calls with neither header are not
 * from a browser and are judged by the session check as usual.
 */
export function assertSameOrigin(request: Request): void {
  if (SAFE_METHODS.has(request.method)) return;
  const origin = request.headers.get("origin");
  const site = request.headers.get("sec-fetch-site");
  if (site === "cross-site") throw new ApiError("forbidden");
  if (!origin) return;
  const allowed = new Set([new URL(request.url).origin, new URL(env().APP_URL).origin]);
  const host = request.headers.get("host");
  if (host) allowed.add(`${new URL(request.url).protocol}//${host}`);
  if (!allowed.has(origin)) throw new ApiError("forbidden");
}

/** Parses URL query parameters with a strict zod schema (unknown parameters are refused). */
export function parseQuery<T extends z.ZodType>(request: Request, schema: T, messages?: MessageKeys): z.infer<T> {
  const params = Object.fromEntries(new URL(request.url).searchParams);
  const parsed = schema.safeParse(params);
  if (!parsed.success) throw zodApiError(parsed.error, requestLocale(request), messages);
  return parsed.data;
}
