import { expect, test, type APIRequestContext, type Browser } from "@playwright/test";
import { demoIds } from "./demo-ids";
import { matrixTokens } from "./api-tokens";
import { ROUTES, TOKEN_HOLDERS, type ApiTokenHolder, type Who } from "./route-table";
import { signInWithPassword } from "./support";

// Every handler × every kind of person: no session → 401; the wrong role, or a member of
// another event → 403 (or 404, which hides whether the event exists); the right role →
// anything but 401/403 (a 400 for a deliberately incomplete body still shows the guard let
// the call through). Holders of read-only API tokens have no session: they get 401 from
// session handlers, 403/404 from token handlers of events outside their token, and the
// token handlers' 405 for any write.
const PEOPLE: Record<Exclude<Who, "anonymous" | ApiTokenHolder>, string> = {
  volunteer: "volunteer2@example.org",
  coordinator: "coordinator@example.org",
  birdsCoordinator: "birds@example.org",
  organiser: "organiser@example.org",
  outsider: "moor-volunteer@example.org",
  admin: "admin@example.org",
};

const isTokenHolder = (who: Who): who is ApiTokenHolder => (TOKEN_HOLDERS as Who[]).includes(who);

async function contextFor(
  browser: Browser,
  baseURL: string,
  who: Who,
  secrets: Record<ApiTokenHolder, string>,
): Promise<APIRequestContext> {
  if (isTokenHolder(who)) {
    const ctx = await browser.newContext({ baseURL, extraHTTPHeaders: { authorization: `Bearer ${secrets[who]}` } });
    return ctx.request;
  }
  const ctx = await browser.newContext({ baseURL });
  if (who !== "anonymous") {
    const page = await ctx.newPage();
    await signInWithPassword(page, PEOPLE[who]);
    await page.close();
  }
  return ctx.request;
}

test("every route handler answers each kind of person as designed", async ({ browser, baseURL }) => {
  test.setTimeout(180_000);
  const { secrets } = await matrixTokens();
  const ids = await demoIds();
  const who: Who[] = [
    "anonymous",
    "volunteer",
    "coordinator",
    "birdsCoordinator",
    "organiser",
    "outsider",
    "admin",
    ...TOKEN_HOLDERS,
  ];
  const problems: string[] = [];
  for (const person of who) {
    const request = await contextFor(browser, baseURL!, person, secrets);
    for (const route of ROUTES) {
      const res = await request.fetch(route.path(ids), {
        method: route.method,
        data: route.body ? route.body(ids) : undefined,
        headers: { origin: baseURL! },
        maxRedirects: 0,
      });
      const status = res.status();
      const label = `${route.method} ${route.path(ids)} as ${person}: ${status}`;
      // Without the kind of credential the handler reads (a session, or a token), a caller is anonymous to it.
      const anonymousHere = person === "anonymous" || (route.auth === "token") !== isTokenHolder(person);
      if (status >= 500) problems.push(`${label} (server error)`);
      else if (route.status !== undefined) {
        if (status !== route.status) problems.push(`${label} (expected ${route.status})`);
      } else if (route.allowed.includes(person)) {
        if (status === 401 || status === 403) problems.push(`${label} (should be allowed)`);
      } else if (anonymousHere) {
        if (status !== 401) problems.push(`${label} (expected 401)`);
      } else if (status !== 403 && status !== 404) problems.push(`${label} (expected 403/404)`);
    }
  }
  expect(problems).toEqual([]);
});
