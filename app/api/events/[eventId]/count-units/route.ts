import { z } from "zod";
import { eventCountUnits, setEventCountUnit } from "@/db/queries/results";
import { requireEventRole } from "@/server/auth/guard";
import { handle } from "@/lib/http/errors";
import { parseJson } from "@/lib/http/body";
import { limitWrites } from "@/lib/http/write-limit";
import { COUNT_UNITS, DEFAULT_COUNT_UNITS, countUnitOf } from "@/lib/results/settings";

export const dynamic = "force-dynamic";

type Ctx = { params: Promise<{ eventId: string }> };

const GROUPS = Object.keys(DEFAULT_COUNT_UNITS) as [string, ...string[]];

/** What a count means for each taxon group of the event: the unit in force and whether the organiser chose it. */
export const GET = handle(async (_request, { params }: Ctx) => {
  const { eventId } = await params;
  await requireEventRole(eventId, "coordinator");
  const chosen = await eventCountUnits(eventId);
  const units = GROUPS.map((group) => ({ group, unit: countUnitOf(group, chosen), chosen: group in chosen }));
  return Response.json({ units }, { headers: { "Cache-Control": "no-store" } });
});

const Body = z.object({ group: z.enum(GROUPS), unit: z.enum(COUNT_UNITS) }).strict();

/** Sets what a count of one taxon group means in the event (organisers); results follow at once. */
export const PUT = handle(async (request, { params }: Ctx) => {
  const { eventId } = await params;
  const { user } = await requireEventRole(eventId, "organiser");
  const body = await parseJson(request, Body);
  limitWrites(`count-units:${user.id}`, 60, 60_000);
  await setEventCountUnit(eventId, body.group, body.unit);
  return Response.json({ group: body.group, unit: body.unit });
});
