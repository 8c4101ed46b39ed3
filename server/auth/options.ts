import "server-only";
import type { NextAuthOptions } from "next-auth";
import CredentialsProvider from "next-auth/providers/credentials";
import EmailProvider from "next-auth/providers/email";
import {
  acceptPendingInvitations,
  authAdapter,
  bumpSessionVersion,
  findUserByEmail,
  hasPendingInvitation,
  sessionVersionOf,
} from "@/db/queries/auth";
import { safeCallbackPath } from "@/lib/auth/callback-url";
import { env } from "@/lib/env";
import { passwordSignInInput } from "@/lib/validation/sign-in";
import { toLocale } from "@/lib/i18n/translator";
import { sendMail } from "@/server/mail/transport";
import { confirmLinkFrom } from "@/server/auth/magic-link";
import { noAccountMail, signInMail } from "@/server/auth/mails";
import { verifyPassword } from "@/server/auth/password";

export const MAGIC_LINK_MAX_AGE_S = 24 * 60 * 60;
// A session lasts 7 days without use and is renewed as it is used (sliding), at most once an
// hour (common practice for a low-risk volunteer app; ASVS 3.3 asks for a bounded lifetime).
export const SESSION_MAX_AGE_S = 7 * 24 * 60 * 60;
export const SESSION_UPDATE_AGE_S = 60 * 60;

/** Thrown by the jwt callback for a token whose session version is no longer the person's. */
const REVOKED = "session_revoked";

/** The locale of the page that asked for the link, read from its callback URL (/es/...). */
export function localeOfUrl(url: string): ReturnType<typeof toLocale> {
  try {
    const callback = new URL(url).searchParams.get("callbackUrl") ?? "";
    return toLocale(new URL(safeCallbackPath(callback, env().APP_URL) ?? "/", env().APP_URL).pathname.split("/")[1]);
  } catch {
    return toLocale(null);
  }
}

export function authOptions(askedLocale?: ReturnType<typeof toLocale>): NextAuthOptions {
  const e = env();
  return {
    secret: e.AUTH_SECRET,
    // Credentials sign-in needs JWT sessions in next-auth 4; roles are read from the
    // database on every request, so a changed role takes effect at once, and so is the
    // person's session version, so sign-out and a password change end sessions at once.
    session: { strategy: "jwt", maxAge: SESSION_MAX_AGE_S, updateAge: SESSION_UPDATE_AGE_S },
    jwt: { maxAge: SESSION_MAX_AGE_S },
    adapter: authAdapter(),
    // Locale-free paths: the locale middleware sends each person to their own language.
    // next-auth's own HTML pages are never shown: each redirects to ours (our headers, our CSP).
    pages: {
      signIn: "/sign-in",
      signOut: "/account",
      verifyRequest: "/sign-in/check-email",
      error: "/sign-in",
      // No newUser page: a first sign-in (an invitation) goes straight to its callbackUrl.
    },
    logger: {
      error(code, meta) {
        if (code === "JWT_SESSION_ERROR" && meta instanceof Error && meta.message === REVOKED) return; // an ended session: expected
        console.error("[next-auth]", code, meta);
      },
      warn(code) {
        console.warn("[next-auth]", code);
      },
      debug() {},
    },
    useSecureCookies: e.APP_URL.startsWith("https://"),
    providers: [
      EmailProvider({
        server: { host: e.SMTP_HOST, port: e.SMTP_PORT },
        from: e.MAIL_FROM,
        maxAge: MAGIC_LINK_MAX_AGE_S,
        async sendVerificationRequest({ identifier, url }) {
          // The mailed link opens our confirm page; only its button (a POST) uses the token,
          // so a mail scanner that follows links does not use up the one-time link.
          const locale = localeOfUrl(url);
          await sendMail({ to: identifier, ...signInMail(locale, confirmLinkFrom(url, locale)) });
        },
      }),
      CredentialsProvider({
        id: "password",
        name: "password",
        credentials: { email: { type: "email" }, password: { type: "password" } },
        async authorize(credentials) {
          const parsed = passwordSignInInput.safeParse(credentials ?? {});
          if (!parsed.success) return null;
          const { email, password } = parsed.data;
          const user = await findUserByEmail(email);
          if (!user?.passwordHash || user.lockedAt) return null; // a locked account cannot sign in
          if (!(await verifyPassword(password, user.passwordHash))) return null;
          return { id: user.id, email: user.email, name: user.name };
        },
      }),
    ],
    callbacks: {
      async signIn({ user, email }) {
        // Asking for a magic link: a link only for people who have an account or an open
        // invitation; anyone else is mailed how to get one. Both get the same answer here
        // (the check-your-mail page), so the form does not tell who has an account.
        if (email?.verificationRequest) {
          const address = (user.email ?? "").toLowerCase();
          if ((await findUserByEmail(address)) || (await hasPendingInvitation(address))) return true;
          await sendMail({ to: address, ...noAccountMail(askedLocale ?? toLocale(null)) });
          return `${e.APP_URL}/api/auth/verify-request?${new URLSearchParams({ provider: "email", type: "email" })}`;
        }
        // A locked account: no session from a magic link either (sessionVersionOf refuses it too).
        if (
          user.id &&
          (await sessionVersionOf(user.id)) === null &&
          (await findUserByEmail(user.email ?? ""))?.lockedAt
        )
          return false;
        return true;
      },
      async jwt({ token, user }) {
        if (user) {
          token.sub = user.id;
          token.sv = (await sessionVersionOf(user.id)) ?? 0;
          return token;
        }
        // Every use of a session: the version it was issued with must still be the person's.
        // If the database cannot answer (it is down), the session is neither ended nor trusted:
        // it is kept, marked unchecked, and getSessionUser answers 503, so a device retries
        // later instead of being told to sign in again (and next-auth does not clear the cookie).
        delete token.unchecked;
        let current: number | null;
        try {
          current = token.sub ? await sessionVersionOf(token.sub) : null;
        } catch {
          return { ...token, unchecked: true };
        }
        if (current === null || current !== token.sv) throw new Error(REVOKED);
        return token;
      },
      async session({ session, token }) {
        if (session.user && token.sub) (session.user as { id?: string }).id = token.sub;
        if (token.unchecked) (session as { unchecked?: boolean }).unchecked = true;
        return session;
      },
      async redirect({ url, baseUrl }) {
        // Only ever back into this app: a normalised same-origin path (lib/auth/callback-url.ts).
        const path = safeCallbackPath(url, e.APP_URL);
        return path ? `${new URL(e.APP_URL).origin}${path}` : baseUrl;
      },
    },
    events: {
      async signIn({ user }) {
        if (user.id && user.email) await acceptPendingInvitations(user.id, user.email);
      },
      // Signing out ends the session on the server too: a copied token stops working.
      // The version is the person's, so this signs them out on every device.
      async signOut({ token }) {
        if (token?.sub) await bumpSessionVersion(token.sub);
      },
    },
  };
}
