import { MailCatcher } from "../support/mail-catcher";
import { DEMO, expect, SignInPage, signInWithPassword, test } from "./support";

test("an organiser signs in with a password and sees their role; signing out ends the session", async ({ page }) => {
  await signInWithPassword(page, DEMO.organiser);
  await expect(page.getByRole("heading", { level: 1, name: "Your account" })).toBeVisible();
  await expect(page.getByText("Signed in as organiser@example.org")).toBeVisible();
  await expect(page.getByRole("link", { name: "organiser in Harrowmere Vale Midsummer Count" })).toBeVisible();
  await page.getByRole("button", { name: "Sign out" }).click();
  await expect(page.getByRole("link", { name: "Sign in" })).toBeVisible();
  await page.goto("/en/account");
  await expect(page).toHaveURL(/\/en\/sign-in\?callbackUrl=%2Fen%2Faccount/);
});

test("a wrong password gets a clear, translated message and no session", async ({ page }) => {
  await (await new SignInPage(page, "es").open()).submitPassword(DEMO.volunteer, "not-the-password");
  await expect(page.getByRole("alert").filter({ hasText: "El correo y la contraseña no coinciden" })).toBeVisible();
  await page.goto("/es/account");
  await expect(page).toHaveURL(/\/es\/sign-in/);
});

test("an invalid address is named before anything is sent", async ({ page }) => {
  const signIn = await new SignInPage(page, "fr").open();
  await signIn.askForLink("not an address");
  await expect(signIn.linkForm.getByRole("alert")).toHaveText(/Saisissez une adresse e-mail/);
});

test("a magic link arrives by e-mail in the person's language and signs them in", async ({ page, mail }) => {
  await (await new SignInPage(page, "es").open()).askForLink(DEMO.coordinator);
  await expect(page.getByRole("heading", { name: "Revisa tu correo" })).toBeVisible();
  const message = await mail.waitFor(DEMO.coordinator, (m) => m.subject === "Tu enlace para entrar en Ecotone");
  await page.goto(MailCatcher.linkIn(message));
  await page.getByRole("main").getByRole("button", { name: "Entrar" }).click(); // the confirm page: a scanner opening the link uses nothing
  await expect(page).toHaveURL(/\/es\/account/);
  await expect(page.getByRole("link", { name: /coordinador\/a en Harrowmere Vale Midsummer Count/ })).toBeVisible();
});

test("an address with no account gets the same answer as any other, and a mail telling how to get one", async ({
  page,
  mail,
}) => {
  await page.goto("/en/sign-in");
  const form = page.getByRole("form", { name: "E-mail me a sign-in link" });
  await form.getByLabel("E-mail address").fill("stranger@example.org");
  await form.getByRole("button", { name: "Send the link" }).click();
  await expect(page.getByRole("heading", { name: "Check your e-mail" })).toBeVisible();
  const message = await mail.waitFor("stranger@example.org");
  expect(message.subject).toBe("Signing in to Ecotone");
  expect(message.text).toContain("ask its organiser for an invitation");
});

test("password tries are limited per address: the sixth wrong try in 15 minutes is refused", async ({ page }) => {
  const signIn = await new SignInPage(page).open();
  for (let i = 0; i < 5; i++) {
    await signIn.submitPassword("volunteer6@example.org", `wrong-${i}-password`);
    await expect(page.getByRole("alert").filter({ hasText: "do not match" })).toBeVisible();
  }
  // Even the right password is refused now, with the reason.
  await signIn.submitPassword("volunteer6@example.org", DEMO.password);
  await expect(page.getByRole("alert").filter({ hasText: "Too many sign-in attempts" })).toBeVisible();
});
