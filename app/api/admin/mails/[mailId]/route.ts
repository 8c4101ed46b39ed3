import { z } from "zod";
import { retryMail } from "@/db/queries/admin";
import { ApiError, handle } from "@/lib/http/errors";
import { parseParams } from "@/lib/http/params";
import { limitWrites } from "@/lib/http/write-limit";
import { requireSiteAdmin } from "@/server/auth/guard";

type Ctx = { params: Promise<{ mailId: string }> };

// The site admin puts a failed or stuck mail back in the outbox (the worker sends it next round).
export const POST = handle<Ctx>(async (_request, { params }) => {
  const { mailId } = await parseParams(params, {
    mailId: z.coerce
      .number()
      .int()
      .positive()
      .max(2 ** 53 - 1),
  });
  const admin = await requireSiteAdmin();
  limitWrites(`admin:${admin.id}`);
  if (!(await retryMail(admin.id, mailId))) throw new ApiError("not_found");
  return Response.json({ ok: true });
});
