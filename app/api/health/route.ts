import { checkDatabase } from "@/db/queries/health";
import { ApiError, handle, parseQuery } from "@/lib/http/errors";
import { healthQuery } from "./schema";

// Public by design: load balancers and the set-up scripts poll it. It reveals no data.
export const dynamic = "force-dynamic";

export const GET = handle(async (request) => {
  parseQuery(request, healthQuery);
  const db = await checkDatabase();
  if (!db.ok) {
    return Response.json(
      { status: "degraded", database: { reachable: false } },
      { status: 503, headers: { "Cache-Control": "no-store" } },
    );
  }
  return Response.json(
    { status: "ok", database: { reachable: true, latencyMs: db.latencyMs, postgis: db.postgis } },
    { headers: { "Cache-Control": "no-store" } },
  );
});

const notAllowed = handle(async () => {
  throw new ApiError("method_not_allowed");
});
export { notAllowed as POST, notAllowed as PUT, notAllowed as PATCH, notAllowed as DELETE };
