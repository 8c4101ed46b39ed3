import { z } from "zod";

// The sign-in forms' inputs: the page's forms check them before posting to next-auth, and
// the password sign-in (server/auth/options.ts, authorize) parses the same schema. next-auth
// reads the magic-link form itself; the rate limits in app/api/auth/[...nextauth]/route.ts
// count every address as typed, valid or not.
export const emailLinkInput = z.object({ email: z.string().trim().toLowerCase().email().max(254) });
export type EmailLinkInput = z.infer<typeof emailLinkInput>;

export const passwordSignInInput = z.object({
  email: z.string().trim().toLowerCase().email().max(254),
  password: z.string().min(1).max(1000),
});
export type PasswordSignInInput = z.infer<typeof passwordSignInInput>;
