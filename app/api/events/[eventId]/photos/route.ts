import { requireEventRole } from "@/server/auth/guard";
import { parseJson } from "@/lib/http/body";
import { handle, requestLocale } from "@/lib/http/errors";
import { parseParams, pathId } from "@/lib/http/params";
import { limitWrites } from "@/lib/http/write-limit";
import { requestPhotoUpload } from "@/server/photos/upload";
import { photoUploadInput } from "./schema";

type Ctx = { params: Promise<{ eventId: string }> };

// A member asks to upload a photo of one of their own sightings: a presigned PUT to the
// photo store, or "already_had" when the server has this photo already.
export const POST = handle<Ctx>(async (request, { params }) => {
  const { eventId } = await parseParams(params, { eventId: pathId });
  const permit = await requireEventRole(eventId, "volunteer");
  limitWrites(`photos:${permit.user.id}`, 240);
  const input = await parseJson(request, photoUploadInput);
  const answer = await requestPhotoUpload({ userId: permit.user.id, eventId, locale: requestLocale(request) }, input);
  return Response.json(answer, { headers: { "Cache-Control": "no-store" } });
});
