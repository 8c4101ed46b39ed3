import { z } from "zod";

// The sign-in forms' inputs; the page's forms and the rate-limit guard share them.
export const emailLinkInput = z.object({ email: z.string().trim().toLowerCase().email().max(254) });
export type EmailLinkInput = z.infer<typeof emailLinkInput>;

export const passwordSignInInput = z.object({
  email: z.string().trim().toLowerCase().email().max(254),
  password: z.string().min(1).max(1000),
});
export type PasswordSignInInput = z.infer<typeof passwordSignInInput>;
