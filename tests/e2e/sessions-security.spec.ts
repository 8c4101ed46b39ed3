import type { APIRequestContext } from "@playwright/test";
import { MailCatcher } from "../support/mail-catcher";
import { withE2eDb } from "./demo-ids";
import { DEMO, expect, signInWithPassword, test } from "./support";

// Issue 13, sign-in and sessions (OWASP ASVS level 1, V2/V3). volunteer4 is used by no other spec.
const PERSON = "volunteer4@example.org";
const ORIGIN = new URL(process.env.E2E_PORT ? `http://127.0.0.1:${process.env.E2E_PORT}` : "http://127.0.0.1:3100")
  .origin;

const OFF_SITE = [
  "/.//evil.example/",
  "/%2e//evil.example/",
  "//evil.example",
  "/\\evil.example",
  "https://evil.example/",
  "/\t/evil.example",
  "http://127.0.0.1:1/en/account",
];

async function passwordSignIn(
  request: APIRequestContext,
  callbackUrl: string,
  email = PERSON,
  password = DEMO.password,
) {
  const { csrfToken } = await (await request.get("/api/auth/csrf")).json();
  const res = await request.post("/api/auth/callback/password", {
    form: { csrfToken, email, password, callbackUrl, json: "true" },
    maxRedirects: 0,
  });
  return (await res.json()) as { url: string };
}

test.describe("open redirect after sign-in", () => {
  for (const shape of OFF_SITE) {
    test(`next-auth's redirect keeps ${JSON.stringify(shape)} on this site`, async ({ request }) => {
      const { url } = await passwordSignIn(request, shape);
      expect(new URL(url).origin).toBe(ORIGIN);
      expect(new URL(url).pathname).not.toMatch(/^\/[/\\]/);
    });
  }

  test("the sign-in page sends each off-site shape to the account page instead", async ({ page }) => {
    for (const shape of ["/.//evil.example/", "/%2e//evil.example/", "//evil.example", "/\\evil.example"]) {
      await page.context().clearCookies();
      await page.goto(`/en/sign-in?callbackUrl=${encodeURIComponent(shape)}`);
      const form = page.getByRole("form", { name: "Sign in with a password" });
      await form.getByLabel("E-mail address").fill(PERSON);
      await form.getByLabel("Password").fill(DEMO.password);
      await form.getByRole("button", { name: "Sign in" }).click();
      await page.waitForURL(/\/en\/account$/);
      expect(new URL(page.url()).origin).toBe(ORIGIN);
    }
  });
});

test("sign-out ends the session on the server: a copied session cookie no longer works", async ({ browser, page }) => {
  await signInWithPassword(page, PERSON);
  const copied = (await page.context().cookies()).filter((c) => c.name.endsWith("next-auth.session-token"));
  expect(copied).toHaveLength(1);
  await page.getByRole("button", { name: "Sign out" }).click();
  await expect(page.getByRole("link", { name: "Sign in" })).toBeVisible();

  const thief = await browser.newContext({ baseURL: ORIGIN });
  await thief.addCookies(copied);
  const session = await (await thief.request.get("/api/auth/session")).json();
  expect(session).toEqual({});
  expect((await thief.request.put("/api/account/password", { data: {} })).status()).toBe(401);
  const tp = await thief.newPage();
  await tp.goto("/en/account");
  await expect(tp).toHaveURL(/\/en\/sign-in\?callbackUrl=/);
  await thief.close();
});

test("changing a password needs the current one and ends every other session, not this one", async ({
  browser,
  page,
}) => {
  const other = await browser.newContext({ baseURL: ORIGIN });
  const otherPage = await other.newPage();
  await signInWithPassword(otherPage, PERSON);
  await signInWithPassword(page, PERSON);

  const put = (body: object) => page.request.put("/api/account/password", { data: body, headers: { origin: ORIGIN } });
  const missing = await put({ password: "a brand new sentence" });
  expect(missing.status()).toBe(422);
  expect((await missing.json()).error.fields).toEqual([
    { field: "currentPassword", message: "The current password is not right." },
  ]);
  const wrong = await put({ currentPassword: "not-it-at-all", password: "a brand new sentence" });
  expect(wrong.status()).toBe(422);

  await page.getByLabel("Current password").fill(DEMO.password);
  await page.getByLabel("New password").fill("a brand new sentence");
  await page.getByRole("button", { name: "Save password" }).click();
  await expect(page.getByRole("status")).toHaveText(
    "✓ Password saved. Every other session of yours has been signed out.",
  );

  // This session goes on; the other one is over.
  await page.reload();
  await expect(page.getByText(`Signed in as ${PERSON}`)).toBeVisible();
  await otherPage.goto("/en/account");
  await expect(otherPage).toHaveURL(/\/en\/sign-in/);
  await other.close();

  // Back to the demo password (the current one is now the new one).
  const back = await put({ currentPassword: "a brand new sentence", password: DEMO.password });
  expect(back.status()).toBe(200);
});

test("a mailed link survives a mail scanner: opening it shows a Sign in button, and only the button uses it", async ({
  page,
  mail,
  request,
}) => {
  await page.goto("/fr/sign-in");
  const form = page.getByRole("form", { name: "Recevoir un lien de connexion" });
  await form.getByLabel("Adresse e-mail").fill(PERSON);
  await form.getByRole("button", { name: "Envoyer le lien" }).click();
  await expect(page.getByRole("heading", { name: "Consultez vos e-mails" })).toBeVisible();
  const message = await mail.waitFor(PERSON, (m) => m.subject.includes("lien"));
  const link = MailCatcher.linkIn(message);
  expect(link).toMatch(/\/fr\/sign-in\/confirm\?token=/);

  // A scanner opens the link (twice), and next-auth's old link shape is only sent to the confirm page.
  for (let i = 0; i < 2; i++) expect((await request.get(link)).status()).toBe(200);
  const old = new URL(link);
  const direct = await request.get(`/api/auth/callback/email${old.search}`, { maxRedirects: 0 });
  expect(direct.status()).toBe(303);
  expect(direct.headers()["location"]).toContain("/fr/sign-in/confirm?token=");

  await page.context().clearCookies();
  await page.goto(link);
  await expect(page.getByRole("heading", { name: "Se connecter à Ecotone" })).toBeVisible();
  await page.getByRole("main").getByRole("button", { name: "Se connecter" }).click();
  await expect(page).toHaveURL(/\/fr\/account$/);
  await expect(page.getByText(`Connecté·e en tant que ${PERSON}`)).toBeVisible();
});

test("asking for a link answers the same for known and unknown addresses; the mail says what to do", async ({
  request,
  mail,
}) => {
  const ask = async (email: string) => {
    const { csrfToken } = await (await request.get("/api/auth/csrf")).json();
    const res = await request.post("/api/auth/signin/email", {
      form: { csrfToken, email, callbackUrl: "/es/account", json: "true" },
    });
    return { status: res.status(), body: await res.json() };
  };
  const known = await ask(DEMO.birdsCoordinator);
  const unknown = await ask("nobody-here@example.org");
  expect(unknown).toEqual(known);
  expect(known.body.url).toMatch(/\/api\/auth\/verify-request\?provider=email&type=email$/);

  const toStranger = await mail.waitFor("nobody-here@example.org");
  expect(toStranger.subject).toBe("Entrar en Ecotone");
  expect(toStranger.text).toContain("aún no hay ninguna cuenta");
  expect(toStranger.text).not.toMatch(/token=/);
  const toKnown = await mail.waitFor(DEMO.birdsCoordinator, (m) => m.subject === "Tu enlace para entrar en Ecotone");
  expect(toKnown.text).toMatch(/\/es\/sign-in\/confirm\?token=/);
  // No account was made for the stranger.
  const rows = await withE2eDb(
    async (c) => (await c.query(`SELECT 1 FROM users WHERE email = 'nobody-here@example.org'`)).rowCount,
  );
  expect(rows).toBe(0);
});

test("next-auth's own pages send people to ours, under our CSP", async ({ request }) => {
  for (const [path, to] of [
    ["/api/auth/signout", "/account"],
    ["/api/auth/error?error=Verification", "/sign-in?error=Verification"],
    ["/api/auth/verify-request", "/sign-in/check-email"],
    ["/api/auth/signin", "/sign-in"],
  ] as const) {
    const res = await request.get(path, { maxRedirects: 0 });
    expect(res.status(), path).toBeGreaterThanOrEqual(300);
    expect(res.status(), path).toBeLessThan(400);
    expect(res.headers()["location"], path).toContain(to);
    const page = await request.get(res.headers()["location"]!);
    expect(page.headers()["content-type"]).toMatch(/text\/html/);
    expect(page.headers()["content-security-policy"]).toMatch(/script-src 'self' 'nonce-/);
  }
});

test("the sign-in rate limit is keyed on the connection's address, not on X-Forwarded-For", async ({ request }) => {
  const { csrfToken } = await (await request.get("/api/auth/csrf")).json();
  await request.post("/api/auth/callback/password", {
    form: {
      csrfToken,
      email: "forged-xff@example.org",
      password: "wrong-password-here",
      callbackUrl: "/en/account",
      json: "true",
    },
    headers: { "x-forwarded-for": "198.51.100.77" },
  });
  const keys = await withE2eDb(async (c) =>
    (await c.query(`SELECT key FROM sign_in_attempts WHERE key LIKE 'ip:%' ORDER BY at DESC LIMIT 1`)).rows.map(
      (r) => r.key as string,
    ),
  );
  expect(keys[0]).toBe("ip:127.0.0.1");
  const forged = await withE2eDb(
    async (c) => (await c.query(`SELECT 1 FROM sign_in_attempts WHERE key = 'ip:198.51.100.77'`)).rowCount,
  );
  expect(forged).toBe(0);
});
