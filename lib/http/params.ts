import { z } from "zod";
import { ApiError } from "./errors";

// Path parameters of the route handlers, parsed by one schema. An id is a uuid in its
// RFC 9562 form (z.uuid(); PostgreSQL's own ids and the devices' randomUUID() are such),
// made lower-case. A malformed parameter answers 404 before anything else runs, for
// everyone alike: the same answer as an id that does not exist, and nothing malformed ever
// reaches PostgreSQL (which would refuse it with an error, a 500).
export const pathId = z.uuid().transform((id) => id.toLowerCase());

/** A report version in a path: a whole number from 1. */
export const pathVersion = z
  .string()
  .regex(/^[1-9][0-9]{0,6}$/)
  .transform(Number)
  .refine((v) => v <= 1_000_000);

export const isUuid = (value: string): boolean => pathId.safeParse(value).success;

/** The handler's path parameters, each parsed by its schema; anything malformed is a 404. */
export async function parseParams<T extends z.ZodRawShape>(
  params: Promise<Record<string, string | string[]>>,
  shape: T,
): Promise<z.infer<z.ZodObject<T>>> {
  const parsed = z.object(shape).safeParse(await params);
  if (!parsed.success) throw new ApiError("not_found");
  return parsed.data;
}
