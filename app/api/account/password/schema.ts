import { z } from "zod";
import { passwordField } from "@/server/auth/password";

export const setPasswordInput = z.object({ password: passwordField }).strict();
export type SetPasswordInput = z.infer<typeof setPasswordInput>;
