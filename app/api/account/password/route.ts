import { setPasswordHash } from "@/db/queries/auth";
import { requireUser } from "@/server/auth/guard";
import { hashPassword, passwordProblems } from "@/server/auth/password";
import { ApiError, handle, requestLocale } from "@/lib/http/errors";
import { translator } from "@/lib/i18n/translator";
import { parseJson } from "@/lib/http/body";
import { limitWrites } from "@/lib/http/write-limit";
import { setPasswordInput } from "./schema";

// Any signed-in person sets or changes their own password.
export const PUT = handle(async (request) => {
  const user = await requireUser();
  limitWrites(`password:${user.id}`, 10, 15 * 60_000);
  const { password } = await parseJson(request, setPasswordInput, { messages: "Account.passwordRules" });
  const problems = passwordProblems(password, user.email);
  if (problems.length) {
    const t = translator(requestLocale(request), "Account");
    throw new ApiError("unprocessable", problems.map((p) => ({ field: "password", message: t(`passwordRules.${p}`) })));
  }
  await setPasswordHash(user.id, await hashPassword(password));
  return Response.json({ ok: true });
});
