import { requireEventRole } from "@/server/auth/guard";
import { handle, parseQuery, requestLocale } from "@/lib/http/errors";
import { parseParams, pathId } from "@/lib/http/params";
import { photoLink } from "@/server/photos/upload";
import { photoGetQuery } from "../schema";

type Ctx = { params: Promise<{ eventId: string; photoId: string }> };

// A photo (?size=thumb or full) for its author and the event's reviewers: a redirect to a
// presigned GET that expires within minutes.
export const GET = handle<Ctx>(async (request, { params }) => {
  const { eventId, photoId } = await parseParams(params, { eventId: pathId, photoId: pathId });
  const permit = await requireEventRole(eventId, "volunteer");
  const { size } = parseQuery(request, photoGetQuery);
  const url = await photoLink(
    {
      userId: permit.user.id,
      eventId,
      locale: requestLocale(request),
      role: permit.role,
      taxonGroups: permit.taxonGroups,
    },
    photoId,
    size,
  );
  return new Response(null, {
    status: 302,
    headers: { Location: url, "Cache-Control": "private, no-store", "Referrer-Policy": "no-referrer" },
  });
});
