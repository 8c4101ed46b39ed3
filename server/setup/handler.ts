import "server-only";
import { z } from "zod";
import { parseJson } from "@/lib/http/body";
import { parseQuery, requestLocale } from "@/lib/http/errors";
import { limitWrites } from "@/lib/http/write-limit";
import type { Locale } from "@/lib/i18n/routing";
import { requireEventRole, type EventPermit } from "@/server/auth/guard";

// The common start of every event-setup handler: an organiser of the event (or a site
// admin), and for writes the setup write limit and the body read with the shared schema,
// whose messages are keys under "Setup.errors" (the form shows the same words).

const noQuery = z.object({}).strict();

/** A setup read: an organiser of the event; no query parameters. */
export async function requireSetupReadPermit(request: Request, eventId: string): Promise<EventPermit> {
  const permit = await requireEventRole(eventId, "organiser");
  parseQuery(request, noQuery);
  return permit;
}

type WriteOptions = {
  maxBytes?: number;
  /** A limit of its own instead of the setup one: [key prefix, calls, window in ms]. */
  limit?: [string, number, number];
};
type Write<T> = EventPermit & { input: T; locale: Locale };

/** A setup write: an organiser of the event, within the write limit, with the body read by `schema` (none without it). */
export async function requireSetupWritePermit(request: Request, eventId: string): Promise<Write<undefined>>;
export async function requireSetupWritePermit<S extends z.ZodType>(
  request: Request,
  eventId: string,
  schema: S,
  options?: WriteOptions,
): Promise<Write<z.infer<S>>>;
export async function requireSetupWritePermit(
  request: Request,
  eventId: string,
  schema?: z.ZodType,
  options: WriteOptions = {},
): Promise<Write<unknown>> {
  const permit = await requireEventRole(eventId, "organiser");
  const [prefix, calls, windowMs] = options.limit ?? ["setup", 120, 60_000];
  limitWrites(`${prefix}:${permit.user.id}`, calls, windowMs);
  const input = schema
    ? await parseJson(request, schema, { maxBytes: options.maxBytes, messages: "Setup.errors" })
    : undefined;
  return { ...permit, input, locale: requestLocale(request) };
}
