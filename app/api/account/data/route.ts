import { z } from "zod";
import { myData } from "@/db/queries/my-data";
import { requireUser } from "@/server/auth/guard";
import { ApiError, handle } from "@/lib/http/errors";
import { limitWrites } from "@/lib/http/write-limit";
import { mySightingsCsv } from "@/lib/account/my-data-csv";

// Any signed-in person downloads everything the site holds about them: JSON (the whole
// account, roles, membership log, sessions, sightings with their decisions) or CSV (the
// sightings and their decisions). Only ever the caller's own data.
export const dynamic = "force-dynamic";

const format = z.enum(["json", "csv"]);

export const GET = handle(async (request) => {
  const user = await requireUser();
  limitWrites(`my-data:${user.id}`, 30, 15 * 60_000);
  const parsed = format.safeParse(new URL(request.url).searchParams.get("format") ?? "json");
  if (!parsed.success) throw new ApiError("bad_request", [{ field: "format", message: "json or csv" }]);
  const data = await myData(user.id);
  if (!data) throw new ApiError("not_found");
  const day = data.exportedAt.slice(0, 10);
  const headers = (type: string, ext: string) => ({
    "Content-Type": type,
    "Content-Disposition": `attachment; filename="ecotone-my-data-${day}.${ext}"`,
    "Cache-Control": "private, no-store",
  });
  if (parsed.data === "csv")
    return new Response(mySightingsCsv(data), { headers: headers("text/csv; charset=utf-8", "csv") });
  return new Response(JSON.stringify(data, null, 2), { headers: headers("application/json; charset=utf-8", "json") });
});
