import NextAuth from "next-auth";
import { safeCallbackPath } from "@/lib/auth/callback-url";
import { env } from "@/lib/env";
import { ApiError, assertSameOrigin, errorResponse } from "@/lib/http/errors";
import { toLocale } from "@/lib/i18n/translator";
import { contentSecurityPolicy, extraOriginsOf, makeNonce } from "@/lib/security/csp";
import { confirmLink } from "@/server/auth/magic-link";
import { authOptions } from "@/server/auth/options";
import { clientIp, recordSignInAttempt, signInAllowed } from "@/server/auth/sign-in-limit";

type Ctx = { params: Promise<{ nextauth: string[] }> };

const localeOf = (callbackUrl: string | null) =>
  toLocale((safeCallbackPath(callbackUrl, env().APP_URL) ?? "/").split("/")[1]);

// next-auth's own handler, with the sign-in rate limits in front of the two ways in:
// asking for a magic link (POST …/signin/email) and a password (POST …/callback/password).
// Public by design: this is how a person gets a session at all.
async function guarded(request: Request, ctx: Ctx): Promise<Response> {
  const path = (await ctx.params).nextauth.join("/");
  const e = env();
  // next-auth's "_log" endpoint lets any browser write lines into the server's log (with a
  // custom logger it is on): closed, so the log holds only what the server itself says.
  if (path === "_log") return errorResponse(new ApiError("not_found"), localeOf(null));

  // A magic link opened directly (an old mail, or a scanner following links): show our
  // confirm page instead of using the token; only its button's POST signs in.
  if (request.method === "GET" && path === "callback/email") {
    const q = new URL(request.url).searchParams;
    const callbackUrl = safeCallbackPath(q.get("callbackUrl"), e.APP_URL) ?? "/";
    const to = confirmLink(
      { token: q.get("token") ?? "", email: q.get("email") ?? "", callbackUrl },
      localeOf(callbackUrl),
    );
    return new Response(null, { status: 303, headers: { Location: to, "Cache-Control": "no-store" } });
  }
  if (request.method === "POST" && path === "callback/email") {
    // Only our own confirm page may post a token (no sign-in forced from another site).
    try {
      assertSameOrigin(request);
    } catch (err) {
      if (err instanceof ApiError)
        return new Response(null, { status: 303, headers: { Location: `${e.APP_URL}/sign-in?error=Verification` } });
      throw err;
    }
  }

  const limited = request.method === "POST" && (path === "signin/email" || path === "callback/password");
  if (!limited) return withOurHeaders(await NextAuth(authOptions())(request, ctx));

  const form = new URLSearchParams(await request.clone().text());
  const email = (form.get("email") ?? "").trim().toLowerCase();
  const ip = clientIp(request.headers);
  if (!(await signInAllowed(email, ip))) {
    // The shape next-auth's client reads: a URL whose "error" parameter names the problem.
    return Response.json(
      { url: `${e.APP_URL}/api/auth/error?error=RateLimited` },
      { headers: { "Cache-Control": "no-store" } },
    );
  }
  const response = await NextAuth(authOptions(localeOf(form.get("callbackUrl"))))(request, ctx);
  const location = response.headers.get("location") ?? "";
  let failed = path === "signin/email"; // every link request counts as a try
  if (!failed) {
    const body = await response
      .clone()
      .text()
      .catch(() => "");
    failed = /error=/.test(location) || /error=/.test(body);
  }
  if (failed && email) await recordSignInAttempt(email, ip);
  return withOurHeaders(response);
}

/** Should next-auth ever answer with a page of its own, it carries our CSP like every page. */
function withOurHeaders(response: Response): Response {
  if (!(response.headers.get("content-type") ?? "").includes("text/html")) return response;
  const e = env();
  const headers = new Headers(response.headers);
  headers.set(
    "Content-Security-Policy",
    contentSecurityPolicy({
      nonce: makeNonce(),
      dev: e.NODE_ENV === "development",
      https: e.APP_URL.startsWith("https://"),
      extraOrigins: extraOriginsOf(e),
    }),
  );
  return new Response(response.body, { status: response.status, statusText: response.statusText, headers });
}

export { guarded as GET, guarded as POST };
