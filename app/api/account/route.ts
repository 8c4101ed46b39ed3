import { eraseAccount } from "@/db/queries/my-data";
import { requireUser } from "@/server/auth/guard";
import { ApiError, handle, requestLocale } from "@/lib/http/errors";
import { parseJson } from "@/lib/http/body";
import { limitWrites } from "@/lib/http/write-limit";
import { translator } from "@/lib/i18n/translator";
import { eraseAccountInput } from "@/lib/account/published-name";

// Any signed-in person erases their own account, after typing their e-mail address. What goes
// and what stays: db/queries/my-data.ts eraseAccount. The session version rises with it, so
// this and every other session of the person end at once.
export const DELETE = handle(async (request) => {
  const user = await requireUser();
  limitWrites(`erase:${user.id}`, 10, 15 * 60_000);
  const { confirm } = await parseJson(request, eraseAccountInput, { messages: "MyData.errors" });
  if (confirm.trim().toLowerCase() !== user.email.toLowerCase()) {
    const t = translator(requestLocale(request), "MyData");
    throw new ApiError("unprocessable", [{ field: "confirm", message: t("errors.confirmMismatch") }]);
  }
  const erased = await eraseAccount(user.id);
  if (!erased) throw new ApiError("not_found");
  return Response.json({ ok: true }, { headers: { "Cache-Control": "no-store" } });
});
