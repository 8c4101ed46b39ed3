import { z } from "zod";
import { ApiError, apiTranslator, requestLocale, zodFieldProblems } from "./errors";

export const MAX_JSON_BYTES = 1_000_000;

/**
 * Reads and validates a JSON body: never a cast (conventions, "things to avoid").
 * Too large, not JSON, or not matching the schema: a 400/413-style answer naming the field.
 */
export async function parseJson<T extends z.ZodType>(request: Request, schema: T, maxBytes = MAX_JSON_BYTES): Promise<z.infer<T>> {
  const locale = requestLocale(request);
  const text = await request.text();
  if (text.length > maxBytes) throw new ApiError("bad_request", [{ field: "(body)", message: apiTranslator(locale)("field.tooLarge", { maximum: maxBytes }) }]);
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch {
    throw new ApiError("bad_request", [{ field: "(body)", message: apiTranslator(locale)("field.notJson") }]);
  }
  const parsed = schema.safeParse(data);
  if (!parsed.success) throw new ApiError("bad_request", zodFieldProblems(parsed.error, locale));
  return parsed.data;
}
