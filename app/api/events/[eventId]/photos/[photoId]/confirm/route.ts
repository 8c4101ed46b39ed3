import { requireEventRole } from "@/server/auth/guard";
import { handle, requestLocale } from "@/lib/http/errors";
import { parseParams, pathId } from "@/lib/http/params";
import { limitWrites } from "@/lib/http/write-limit";
import { confirmPhoto } from "@/server/photos/upload";

type Ctx = { params: Promise<{ eventId: string; photoId: string }> };

// After the upload: the server checks the bytes in the photo store and records the photo.
export const POST = handle<Ctx>(async (request, { params }) => {
  const { eventId, photoId } = await parseParams(params, { eventId: pathId, photoId: pathId });
  const permit = await requireEventRole(eventId, "volunteer");
  limitWrites(`photos:${permit.user.id}`, 240);
  const answer = await confirmPhoto({ userId: permit.user.id, eventId, locale: requestLocale(request) }, photoId);
  return Response.json(answer, { headers: { "Cache-Control": "no-store" } });
});
