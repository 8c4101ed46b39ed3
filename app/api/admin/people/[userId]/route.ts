import { endSessionsOf, liveAccountEmail, setAccountLocked } from "@/db/queries/admin";
import { eraseAccount } from "@/db/queries/my-data";
import { parseJson } from "@/lib/http/body";
import { ApiError, handle, requestLocale } from "@/lib/http/errors";
import { parseParams, pathId } from "@/lib/http/params";
import { limitWrites } from "@/lib/http/write-limit";
import { translator } from "@/lib/i18n/translator";
import { requireSiteAdmin } from "@/server/auth/guard";
import { adminEraseInput, adminPersonInput } from "./schema";

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

// The site admin erases an account by the same rule as a person's own erasure (db/queries/my-data.ts
// eraseAccount: a tombstone with an anonymous recorder name, the append-only logs redacted, never
// emptied), after typing the person's address; the admin log records it under the tombstone.
// Their own account a site admin erases from their account page, like anyone.
export const DELETE = handle<Ctx>(async (request, { params }) => {
  const { userId } = await parseParams(params, { userId: pathId });
  const admin = await requireSiteAdmin();
  limitWrites(`admin:${admin.id}`);
  const { confirm, reason } = await parseJson(request, adminEraseInput, { messages: "Organisations.errors" });
  if (userId === admin.id) throw new ApiError("conflict");
  const email = await liveAccountEmail(userId);
  if (!email) throw new ApiError("not_found");
  if (confirm.trim().toLowerCase() !== email.toLowerCase()) {
    const t = translator(requestLocale(request), "Organisations");
    throw new ApiError("unprocessable", [{ field: "confirm", message: t("errors.eraseMismatch") }]);
  }
  const erased = await eraseAccount(userId, { adminId: admin.id, reason });
  if (!erased) throw new ApiError("not_found");
  return Response.json({ ok: true, recorder: erased.recorder }, { headers: { "Cache-Control": "no-store" } });
});
