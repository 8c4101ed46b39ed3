import { endSessionsOf, setAccountLocked } from "@/db/queries/admin";
import { parseJson } from "@/lib/http/body";
import { ApiError, handle } from "@/lib/http/errors";
import { parseParams, pathId } from "@/lib/http/params";
import { limitWrites } from "@/lib/http/write-limit";
import { requireSiteAdmin } from "@/server/auth/guard";
import { adminPersonInput } from "./schema";

type Ctx = { params: Promise<{ userId: string }> };

// The site admin locks or unlocks an account, or ends its sessions; each in the admin log.
export const POST = handle<Ctx>(async (request, { params }) => {
  const { userId } = await parseParams(params, { userId: pathId });
  const admin = await requireSiteAdmin();
  limitWrites(`admin:${admin.id}`);
  const { action, reason } = await parseJson(request, adminPersonInput, { messages: "Organisations.errors" });
  if (action !== "end_sessions" && userId === admin.id) throw new ApiError("conflict"); // never lock oneself out
  const done =
    action === "end_sessions"
      ? await endSessionsOf(admin.id, userId)
      : await setAccountLocked(admin.id, userId, action === "lock", reason);
  if (!done) throw new ApiError(action === "end_sessions" ? "not_found" : "conflict");
  return Response.json({ ok: true });
});
