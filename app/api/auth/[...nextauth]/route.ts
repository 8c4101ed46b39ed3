import NextAuth from "next-auth";
import { authOptions } from "@/server/auth/options";
import { clientIp, recordSignInAttempt, signInAllowed } from "@/server/auth/sign-in-limit";
import { env } from "@/lib/env";

type Ctx = { params: Promise<{ nextauth: string[] }> };

// next-auth's own handler, with the sign-in rate limits in front of the two ways in:
// asking for a magic link (POST …/signin/email) and a password (POST …/callback/password).
// Public by design: this is how a person gets a session at all.
async function guarded(request: Request, ctx: Ctx): Promise<Response> {
  const handler = NextAuth(authOptions());
  const path = (await ctx.params).nextauth.join("/");
  const limited = request.method === "POST" && (path === "signin/email" || path === "callback/password");
  if (!limited) return handler(request, ctx);

  const form = new URLSearchParams(await request.clone().text());
  const email = (form.get("email") ?? "").trim().toLowerCase();
  const ip = clientIp(request.headers);
  if (!(await signInAllowed(email, ip))) {
    // The shape next-auth's client reads: a URL whose "error" parameter names the problem.
    return Response.json({ url: `${env().APP_URL}/api/auth/error?error=RateLimited` }, { headers: { "Cache-Control": "no-store" } });
  }
  const response = await handler(request, ctx);
  const location = response.headers.get("location") ?? "";
  let failed = path === "signin/email"; // every link request counts as a try
  if (!failed) {
    const body = await response.clone().text().catch(() => "");
    failed = /error=/.test(location) || /error=/.test(body);
  }
  if (failed && email) await recordSignInAttempt(email, ip);
  return response;
}

export { guarded as GET, guarded as POST };
