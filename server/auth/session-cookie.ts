import "server-only";
import { decode, encode } from "next-auth/jwt";
import { env } from "@/lib/env";
import { SESSION_MAX_AGE_S } from "@/server/auth/options";

// The session cookie of next-auth 4 (JWT strategy), read and written where a handler must
// keep the caller's own session alive after raising their session version (password change).
export function sessionCookieName(): string {
  return `${env().APP_URL.startsWith("https://") ? "__Secure-" : ""}next-auth.session-token`;
}

function readCookie(request: Request, name: string): string | null {
  for (const part of (request.headers.get("cookie") ?? "").split(/;\s*/)) {
    const i = part.indexOf("=");
    if (i > 0 && part.slice(0, i) === name) return decodeURIComponent(part.slice(i + 1));
  }
  return null;
}

/** A Set-Cookie value that carries the caller's session on, at the new session version; null without a readable session. */
export async function renewedSessionCookie(request: Request, sessionVersion: number): Promise<string | null> {
  const name = sessionCookieName();
  const raw = readCookie(request, name);
  if (!raw) return null;
  const secret = env().AUTH_SECRET;
  const token = await decode({ token: raw, secret });
  if (!token) return null;
  const value = await encode({ token: { ...token, sv: sessionVersion }, secret, maxAge: SESSION_MAX_AGE_S });
  const expires = new Date(Date.now() + SESSION_MAX_AGE_S * 1000).toUTCString();
  const secure = name.startsWith("__Secure-") ? "; Secure" : "";
  return `${name}=${value}; Path=/; Expires=${expires}; HttpOnly; SameSite=Lax${secure}`;
}
