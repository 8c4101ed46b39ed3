import "server-only";
import { createHash, randomBytes } from "node:crypto";
import { storeVerificationToken } from "@/db/queries/auth";
import { safeCallbackPath } from "@/lib/auth/callback-url";
import { env } from "@/lib/env";
import { toLocale } from "@/lib/i18n/translator";

// next-auth 4 stores e-mail tokens hashed as sha256(token + secret) and accepts them at
// /api/auth/callback/email; invitation mails use the same mechanism with a longer life.
export function hashVerificationToken(token: string): string {
  return createHash("sha256").update(`${token}${env().AUTH_SECRET}`).digest("hex");
}

export async function createMagicLink(email: string, callbackPath: string, maxAgeSeconds: number): Promise<string> {
  const token = randomBytes(32).toString("hex");
  await storeVerificationToken(
    email.toLowerCase(),
    hashVerificationToken(token),
    new Date(Date.now() + maxAgeSeconds * 1000),
  );
  const base = env().APP_URL;
  const callbackUrl = safeCallbackPath(callbackPath, base) ?? "/";
  return confirmLink({ token, email: email.toLowerCase(), callbackUrl }, toLocale(callbackUrl.split("/")[1]));
}

type LinkParams = { token: string; email: string; callbackUrl: string };

/**
 * The link a mail carries: our confirm page, which shows a "Sign in" button; the button
 * POSTs the token to next-auth's e-mail callback. Opening the link uses nothing up.
 */
export function confirmLink(p: LinkParams, locale: string): string {
  const params = new URLSearchParams({ token: p.token, email: p.email, callbackUrl: p.callbackUrl });
  return `${env().APP_URL}/${locale}/sign-in/confirm?${params}`;
}

/** The confirm-page link for next-auth's own callback link (…/api/auth/callback/email?token=…&email=…&callbackUrl=…). */
export function confirmLinkFrom(nextAuthUrl: string, locale: string): string {
  const q = new URL(nextAuthUrl).searchParams;
  const callbackUrl = safeCallbackPath(q.get("callbackUrl"), env().APP_URL) ?? `/${locale}/account`;
  return confirmLink({ token: q.get("token") ?? "", email: q.get("email") ?? "", callbackUrl }, locale);
}

/** Where the confirm page's button posts: next-auth's e-mail callback, with the link's own parameters. */
export function emailCallbackAction(p: LinkParams): string {
  return `/api/auth/callback/email?${new URLSearchParams({ callbackUrl: p.callbackUrl, token: p.token, email: p.email })}`;
}
