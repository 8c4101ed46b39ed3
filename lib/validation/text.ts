import { z } from "zod";

// Text a person typed or a file carried. PostgreSQL text cannot hold U+0000, so it is
// refused here with a message (a key under Setup.errors) rather than failing in the database.
export const hasNoNul = (s: string) => !s.includes("\u0000");

/** The message of the issue a NUL raises; lib/http/errors.ts answers it with a 422 naming the field. */
export const NUL_ISSUE = "invalidChar";

/** Any free text: a string with no U+0000 (chain .trim(), .min(), .max() after it). */
export const freeText = () => z.string().refine(hasNoNul, { error: NUL_ISSUE });

export const plainText = (max: number) =>
  z.string().max(max, { error: "tooLong" }).refine(hasNoNul, { error: NUL_ISSUE });

/** "YYYY-MM-DDTHH:mm" that names a real day and time (no 30 February, no 25:61). */
export function isRealLocalDateTime(s: string): boolean {
  const m = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})$/.exec(s);
  if (!m) return false;
  const [y, mo, d, h, mi] = m.slice(1).map(Number) as [number, number, number, number, number];
  if (y < 1900 || y > 2200 || h > 23 || mi > 59) return false;
  const date = new Date(Date.UTC(y, mo - 1, d));
  return date.getUTCFullYear() === y && date.getUTCMonth() === mo - 1 && date.getUTCDate() === d;
}
