import { z } from "zod";
import { passwordField } from "@/server/auth/password";

// currentPassword: required whenever the person already has a password (checked in the handler).
export const setPasswordInput = z
  .object({ currentPassword: z.string().max(1000).optional(), password: passwordField })
  .strict();
export type SetPasswordInput = z.infer<typeof setPasswordInput>;
