import { changePassword, passwordHashOf } from "@/db/queries/auth";
import { requireUser } from "@/server/auth/guard";
import { hashPassword, passwordProblems, verifyPassword } from "@/server/auth/password";
import { renewedSessionCookie } from "@/server/auth/session-cookie";
import { ApiError, handle, requestLocale } from "@/lib/http/errors";
import { translator } from "@/lib/i18n/translator";
import { parseJson } from "@/lib/http/body";
import { limitWrites } from "@/lib/http/write-limit";
import { setPasswordInput } from "./schema";

// Any signed-in person sets or changes their own password. Changing one needs the current
// password (a session cookie alone is not enough), and ends every other session of the
// person: the session version rises, and only this caller's cookie is renewed with it.
export const PUT = handle(async (request) => {
  const user = await requireUser();
  limitWrites(`password:${user.id}`, 10, 15 * 60_000);
  const { currentPassword, password } = await parseJson(request, setPasswordInput, {
    messages: "Account.passwordRules",
  });
  const t = translator(requestLocale(request), "Account");
  const existing = await passwordHashOf(user.id);
  if (existing && !(currentPassword && (await verifyPassword(currentPassword, existing)))) {
    throw new ApiError("unprocessable", [{ field: "currentPassword", message: t("currentPasswordWrong") }]);
  }
  const problems = passwordProblems(password, user.email);
  if (problems.length) {
    throw new ApiError(
      "unprocessable",
      problems.map((p) => ({ field: "password", message: t(`passwordRules.${p}`) })),
    );
  }
  const version = await changePassword(user.id, await hashPassword(password));
  const cookie = await renewedSessionCookie(request, version);
  const headers = new Headers({ "Cache-Control": "no-store" });
  if (cookie) headers.append("Set-Cookie", cookie);
  return Response.json({ ok: true }, { headers });
});
