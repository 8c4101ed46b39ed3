import { z } from "zod";
import { ApiError, apiTranslator, requestLocale, zodApiError, type MessageKeys } from "./errors";

export const MAX_JSON_BYTES = 1_000_000;
/**
 * Deepest nesting of arrays and objects a body may have. Our deepest legitimate body is a
 * GeoJSON MultiPolygon inside a FeatureCollection (about 7 levels); 64 leaves room and stops
 * a body of thousands of levels before JSON.parse or a schema walks it (common practice).
 */
export const MAX_JSON_DEPTH = 64;

/** application/json, with or without parameters (charset), in any letter case. */
export const isJsonContentType = (value: string | null) => /^application\/json\s*(;|$)/i.test(value?.trim() ?? "");

/**
 * The deepest nesting of `text` read as JSON, counting brackets outside strings only: one
 * pass, no recursion, stops as soon as `limit` is passed. Malformed text is left to JSON.parse.
 */
export function jsonDepthExceeds(text: string, limit: number): boolean {
  let depth = 0;
  let inString = false;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (inString) {
      if (c === 92)
        i++; // backslash: skip the escaped character
      else if (c === 34) inString = false;
    } else if (c === 34) inString = true;
    else if (c === 91 || c === 123) {
      if (++depth > limit) return true;
    } else if (c === 93 || c === 125) depth--;
  }
  return false;
}

export type BodyOptions = {
  maxBytes?: number;
  /** The namespace of the message keys the schema's issues carry (a schema shared with a form), e.g. "Setup.errors". */
  messages?: MessageKeys;
};

/**
 * The one request-body reader: reads and validates a JSON body, never a cast (conventions,
 * "things to avoid"). Not sent as application/json: a 415. Too large, nested too deeply, not
 * JSON, or not matching the schema: a 400 naming each wrong field, in the caller's language.
 */
export async function parseJson<T extends z.ZodType>(
  request: Request,
  schema: T,
  options: BodyOptions = {},
): Promise<z.infer<T>> {
  const { maxBytes = MAX_JSON_BYTES, messages } = options;
  const locale = requestLocale(request);
  const t = apiTranslator(locale);
  if (!isJsonContentType(request.headers.get("content-type")))
    throw new ApiError("unsupported_media_type", [{ field: "(content-type)", message: t("field.notJsonType") }]);
  const text = await readBody(request, maxBytes, locale);
  if (jsonDepthExceeds(text, MAX_JSON_DEPTH))
    throw new ApiError("bad_request", [{ field: "(body)", message: t("field.tooDeep", { maximum: MAX_JSON_DEPTH }) }]);
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch {
    throw new ApiError("bad_request", [{ field: "(body)", message: t("field.notJson") }]);
  }
  const parsed = schema.safeParse(data);
  if (!parsed.success) throw zodApiError(parsed.error, locale, messages);
  return parsed.data;
}

/**
 * The body as text, refused as soon as it passes maxBytes (by its Content-Length or while it
 * streams in), so an oversized body is never held whole in memory. A body cut off by the
 * client (a phone losing signal mid-upload) is a 400, not a server error: the device never
 * hears the answer and sends the batch again.
 */
async function readBody(request: Request, maxBytes: number, locale: ReturnType<typeof requestLocale>): Promise<string> {
  const t = apiTranslator(locale);
  const tooLarge = () =>
    new ApiError("bad_request", [{ field: "(body)", message: t("field.tooLarge", { maximum: maxBytes }) }]);
  const declared = Number(request.headers.get("content-length") ?? NaN);
  if (Number.isFinite(declared) && declared > maxBytes) throw tooLarge();
  if (!request.body) return "";
  const reader = request.body.getReader();
  const chunks: Uint8Array[] = [];
  let size = 0;
  try {
    for (;;) {
      const { done, value } = await reader.read();
      if (done) break;
      size += value.byteLength;
      if (size > maxBytes) {
        await reader.cancel().catch(() => {});
        throw tooLarge();
      }
      chunks.push(value);
    }
  } catch (err) {
    if (err instanceof ApiError) throw err;
    throw new ApiError("bad_request", [{ field: "(body)", message: t("field.bodyIncomplete") }]);
  }
  return new TextDecoder().decode(Buffer.concat(chunks));
}
