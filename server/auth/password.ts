import bcrypt from "bcryptjs";
import { z } from "zod";

// bcrypt (Provos & Mazières 1999) via bcryptjs; cost 12 is common practice for interactive sign-in.
const COST = 12;

export const hashPassword = (plain: string) => bcrypt.hash(plain, COST);
export const verifyPassword = (plain: string, hash: string) => bcrypt.compare(plain, hash);

// Length over composition rules, as NIST SP 800-63B advises; bcrypt reads only 72 bytes.
export const PASSWORD_MIN = 10;
export const PASSWORD_MAX_BYTES = 72;

/** Problems with a new password, as message keys under "Account.passwordRules". */
export function passwordProblems(
  password: string,
  email?: string,
): ("tooShort" | "tooLong" | "sameAsEmail" | "tooCommon")[] {
  const problems: ("tooShort" | "tooLong" | "sameAsEmail" | "tooCommon")[] = [];
  if ([...password].length < PASSWORD_MIN) problems.push("tooShort");
  if (new TextEncoder().encode(password).length > PASSWORD_MAX_BYTES) problems.push("tooLong");
  if (email && password.trim().toLowerCase() === email.trim().toLowerCase()) problems.push("sameAsEmail");
  if (/^(.)\1+$/.test(password) || /^(0123456789|1234567890|password\d*|qwertyuiop|iloveyou\d*)$/i.test(password))
    problems.push("tooCommon");
  return problems;
}

export const passwordField = z.string().superRefine((value, ctx) => {
  for (const p of passwordProblems(value)) ctx.addIssue({ code: "custom", message: p });
});
