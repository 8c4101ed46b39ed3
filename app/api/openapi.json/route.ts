import { env } from "@/lib/env";
import { handle, requestLocale } from "@/lib/http/errors";
import { translator } from "@/lib/i18n/translator";
import { openApiDocument } from "./document";

// Public by design: the description of the public and token endpoints reveals no data.
export const dynamic = "force-dynamic";

export const GET = handle(async (request) => {
  const t = translator(requestLocale(request), "ApiReference") as (key: string) => string;
  return Response.json(openApiDocument(t, env().APP_URL), { headers: { "Cache-Control": "no-store" } });
});
