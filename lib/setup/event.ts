import { z } from "zod";
import { SESSION_KINDS } from "@/lib/domain";
import { locales } from "@/lib/i18n/routing";
import { isTimeZone } from "@/lib/time/zoned";
import { isRealLocalDateTime, plainText } from "@/lib/validation/text";

// An event's details, as the organiser's form and the server both read them. Dates are
// wall-clock times in the event's own time zone ("2026-06-20T06:00"); the server turns
// them into instants with that zone. Messages are keys under "Setup.errors".
const localDateTime = z.string().refine(isRealLocalDateTime, { error: "dateTime" });

export const eventFields = z.object({
  name: plainText(120)
    .transform((v) => v.trim())
    .refine((v) => v.length > 0, { error: "required" }),
  description: plainText(2000),
  startsLocal: localDateTime,
  endsLocal: localDateTime,
  timeZone: z.string().refine(isTimeZone, { error: "timeZone" }),
  languages: z.array(z.enum(locales)).min(1, { error: "pickOne" }).max(locales.length),
  sessionKinds: z.array(z.enum(SESSION_KINDS)).min(1, { error: "pickOne" }).max(SESSION_KINDS.length),
  photoRequiredSensitive: z.boolean(),
  photoRequiredOffList: z.boolean(),
  accuracyLimitM: z
    .number({ error: "number" })
    .int({ error: "number" })
    .min(1, { error: "accuracyRange" })
    .max(10_000, { error: "accuracyRange" }),
});

export const endsAfterStarts = (v: { startsLocal: string; endsLocal: string }) => v.endsLocal > v.startsLocal;

export const createEventInput = eventFields
  .extend({
    slug: z
      .string()
      .max(80, { error: "tooLong" })
      .regex(/^[a-z0-9]+(-[a-z0-9]+)*$/, { error: "slug" }),
  })
  .strict()
  .refine(endsAfterStarts, { error: "endsBeforeStart", path: ["endsLocal"] });
export type CreateEventInput = z.infer<typeof createEventInput>;
