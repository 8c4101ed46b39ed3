import "server-only";
import type { NextAuthOptions } from "next-auth";
import CredentialsProvider from "next-auth/providers/credentials";
import EmailProvider from "next-auth/providers/email";
import { acceptPendingInvitations, authAdapter, findUserByEmail, hasPendingInvitation } from "@/db/queries/auth";
import { env } from "@/lib/env";
import { passwordSignInInput } from "@/lib/validation/sign-in";
import { toLocale } from "@/lib/i18n/translator";
import { sendMail } from "@/server/mail/transport";
import { signInMail } from "@/server/auth/mails";
import { verifyPassword } from "@/server/auth/password";

export const MAGIC_LINK_MAX_AGE_S = 24 * 60 * 60;

/** The locale of the page that asked for the link, read from its callback URL (/es/...). */
function localeOfUrl(url: string): ReturnType<typeof toLocale> {
  try {
    const callback = new URL(url).searchParams.get("callbackUrl") ?? "";
    return toLocale(new URL(callback, env().APP_URL).pathname.split("/")[1]);
  } catch {
    return toLocale(null);
  }
}

export function authOptions(): NextAuthOptions {
  const e = env();
  return {
    secret: e.AUTH_SECRET,
    // Credentials sign-in needs JWT sessions in next-auth 4; roles are read from the
    // database on every request, so a changed role takes effect at once.
    session: { strategy: "jwt", maxAge: 30 * 24 * 60 * 60 },
    adapter: authAdapter(),
    // Locale-free paths: the locale middleware sends each person to their own language.
    pages: { signIn: "/sign-in", verifyRequest: "/sign-in/check-email", error: "/sign-in" },
    useSecureCookies: e.APP_URL.startsWith("https://"),
    providers: [
      EmailProvider({
        server: { host: e.SMTP_HOST, port: e.SMTP_PORT },
        from: e.MAIL_FROM,
        maxAge: MAGIC_LINK_MAX_AGE_S,
        async sendVerificationRequest({ identifier, url }) {
          await sendMail({ to: identifier, ...signInMail(localeOfUrl(url), url) });
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
          if (!user?.passwordHash) return null;
          if (!(await verifyPassword(password, user.passwordHash))) return null;
          return { id: user.id, email: user.email, name: user.name };
        },
      }),
    ],
    callbacks: {
      async signIn({ user, email }) {
        // Asking for a magic link: only for people who have an account or an open invitation.
        if (email?.verificationRequest) {
          const address = user.email ?? "";
          return Boolean((await findUserByEmail(address)) || (await hasPendingInvitation(address)));
        }
        return true;
      },
      async jwt({ token, user }) {
        if (user) token.sub = user.id;
        return token;
      },
      async session({ session, token }) {
        if (session.user && token.sub) (session.user as { id?: string }).id = token.sub;
        return session;
      },
      async redirect({ url, baseUrl }) {
        // Only ever back into this app.
        if (url.startsWith("/")) return `${baseUrl}${url}`;
        try {
          if (new URL(url).origin === baseUrl) return url;
        } catch {}
        return baseUrl;
      },
    },
    events: {
      async signIn({ user }) {
        if (user.id && user.email) await acceptPendingInvitations(user.id, user.email);
      },
    },
  };
}
