import { expect, test } from "@playwright/test";
import { signInWithPassword } from "./support";

test("pages are served under a nonce-based Content-Security-Policy that they actually run under", async ({ page }) => {
  const violations: string[] = [];
  page.on("console", (m) => {
    if (/Content Security Policy|Refused to/i.test(m.text())) violations.push(m.text());
  });
  const res = await page.goto("/en/sign-in");
  const csp = res!.headers()["content-security-policy"] ?? "";
  expect(csp).toMatch(/script-src 'self' 'nonce-[A-Za-z0-9+/=]{20,}' 'strict-dynamic'/);
  expect(csp).toContain("frame-ancestors 'none'");
  expect(csp).toContain("object-src 'none'");
  expect(res!.headers()["x-content-type-options"]).toBe("nosniff");
  expect(res!.headers()["referrer-policy"]).toBe("strict-origin-when-cross-origin");

  // Each page load gets its own nonce.
  const again = await page.request.get("/en/sign-in");
  expect(again.headers()["content-security-policy"]).not.toBe(csp);

  // The page still hydrates and works: client-side validation runs.
  const form = page.getByRole("form", { name: "E-mail me a sign-in link" });
  await form.getByRole("button", { name: "Send the link" }).click();
  await expect(form.getByRole("alert")).toHaveText(/Enter an e-mail address/);
  expect(violations).toEqual([]);
});

test("session cookies are HttpOnly and SameSite", async ({ page }) => {
  await signInWithPassword(page, "volunteer3@example.org");
  const session = (await page.context().cookies()).find((c) => c.name.endsWith("next-auth.session-token"));
  expect(session).toBeDefined();
  expect(session!.httpOnly).toBe(true);
  expect(session!.sameSite).toBe("Lax");
});
