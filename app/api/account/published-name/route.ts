import { setPublishedName } from "@/db/queries/my-data";
import { requireUser } from "@/server/auth/guard";
import { handle } from "@/lib/http/errors";
import { parseJson } from "@/lib/http/body";
import { limitWrites } from "@/lib/http/write-limit";
import { publishedNameInput } from "@/lib/account/published-name";

// Any signed-in person chooses the name published with their approved sightings, with consent.
export const PUT = handle(async (request) => {
  const user = await requireUser();
  limitWrites(`published-name:${user.id}`, 20, 15 * 60_000);
  const { publishedName } = await parseJson(request, publishedNameInput, { messages: "MyData.errors" });
  await setPublishedName(user.id, publishedName);
  return Response.json({ ok: true, publishedName });
});
