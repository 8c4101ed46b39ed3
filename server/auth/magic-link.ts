import "server-only";
import { createHash, randomBytes } from "node:crypto";
import { storeVerificationToken } from "@/db/queries/auth";
import { env } from "@/lib/env";

// next-auth 4 stores e-mail tokens hashed as sha256(token + secret) and accepts them at
// /api/auth/callback/email; invitation mails use the same mechanism with a longer life.
export function hashVerificationToken(token: string): string {
  return createHash("sha256").update(`${token}${env().AUTH_SECRET}`).digest("hex");
}

export async function createMagicLink(email: string, callbackPath: string, maxAgeSeconds: number): Promise<string> {
  const token = randomBytes(32).toString("hex");
  await storeVerificationToken(email.toLowerCase(), hashVerificationToken(token), new Date(Date.now() + maxAgeSeconds * 1000));
  const base = env().APP_URL;
  const params = new URLSearchParams({ callbackUrl: new URL(callbackPath, base).toString(), token, email: email.toLowerCase() });
  return `${base}/api/auth/callback/email?${params}`;
}
