import { eventCountUnits, setEventCountUnit } from "@/db/queries/results";
import { requireEventRole } from "@/server/auth/guard";
import { handle } from "@/lib/http/errors";
import { parseJson } from "@/lib/http/body";
import { parseParams, pathId } from "@/lib/http/params";
import { countUnitInput } from "./schema";
import { limitWrites } from "@/lib/http/write-limit";
import { countUnitOf } from "@/lib/results/settings";
import { TAXON_GROUPS } from "@/lib/domain";

export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ eventId: string }> };

const GROUPS = TAXON_GROUPS;

/** What a count means for each taxon group of the event: the unit in force and whether the organiser chose it. */
export const GET = handle(async (_request, { params }: Ctx) => {
  const { eventId } = await parseParams(params, { eventId: pathId });
  await requireEventRole(eventId, "coordinator");
  const chosen = await eventCountUnits(eventId);
  const units = GROUPS.map((group) => ({ group, unit: countUnitOf(group, chosen), chosen: group in chosen }));
  return Response.json({ units }, { headers: { "Cache-Control": "no-store" } });
});

/** Sets what a count of one taxon group means in the event (organisers); results follow at once. */
export const PUT = handle(async (request, { params }: Ctx) => {
  const { eventId } = await parseParams(params, { eventId: pathId });
  const { user } = await requireEventRole(eventId, "organiser");
  const body = await parseJson(request, countUnitInput);
  limitWrites(`count-units:${user.id}`, 60, 60_000);
  await setEventCountUnit(eventId, body.group, body.unit);
  return Response.json({ group: body.group, unit: body.unit });
});
