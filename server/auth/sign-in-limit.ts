import "server-only";
import { countRecentAttempts, recordAttempts } from "@/db/queries/auth";
import { env } from "@/lib/env";
import { clientAddress } from "@/lib/http/client-address";

// Sign-in tries per 15 minutes: 5 per address (guessing one person's password), 60 per
// IP address (a whole field team may share one mobile network's address).
export const WINDOW_MS = 15 * 60_000;
export const LIMIT_PER_ADDRESS = 5;
export const LIMIT_PER_IP = 60;

/** The real client address (lib/http/client-address.ts): X-Forwarded-For only through TRUSTED_PROXIES. */
export function clientIp(headers: Headers): string {
  return clientAddress(headers, env().TRUSTED_PROXIES);
}

const keysFor = (email: string, ip: string) => ({ email: `email:${email.trim().toLowerCase()}`, ip: `ip:${ip}` });

export async function signInAllowed(email: string, ip: string): Promise<boolean> {
  const k = keysFor(email, ip);
  const since = new Date(Date.now() - WINDOW_MS);
  const [byEmail, byIp] = await Promise.all([countRecentAttempts(k.email, since), countRecentAttempts(k.ip, since)]);
  return byEmail < LIMIT_PER_ADDRESS && byIp < LIMIT_PER_IP;
}

export async function recordSignInAttempt(email: string, ip: string): Promise<void> {
  const k = keysFor(email, ip);
  await recordAttempts([k.email, k.ip], new Date(Date.now() - 4 * WINDOW_MS));
}
