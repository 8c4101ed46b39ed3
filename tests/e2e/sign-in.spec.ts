import { MailCatcher } from "../support/mail-catcher";
import { DEMO, expect, signInWithPassword, test } from "./support";

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
  await page.goto("/es/sign-in");
  const form = page.getByRole("form", { name: "Entrar con contraseña" });
  await form.getByLabel("Correo electrónico").fill(DEMO.volunteer);
  await form.getByLabel("Contraseña").fill("not-the-password");
  await form.getByRole("button", { name: "Entrar" }).click();
  await expect(page.getByRole("alert").filter({ hasText: "El correo y la contraseña no coinciden" })).toBeVisible();
  await page.goto("/es/account");
  await expect(page).toHaveURL(/\/es\/sign-in/);
});

test("an invalid address is named before anything is sent", async ({ page }) => {
  await page.goto("/fr/sign-in");
  const form = page.getByRole("form", { name: "Recevoir un lien de connexion" });
  await form.getByLabel("Adresse e-mail").fill("not an address");
  await form.getByRole("button", { name: "Envoyer le lien" }).click();
  await expect(form.getByRole("alert")).toHaveText(/Saisissez une adresse e-mail/);
});

test("a magic link arrives by e-mail in the person's language and signs them in", async ({ page, mail }) => {
  await page.goto("/es/sign-in");
  const form = page.getByRole("form", { name: "Enviarme un enlace para entrar" });
  await form.getByLabel("Correo electrónico").fill(DEMO.coordinator);
  await form.getByRole("button", { name: "Enviar el enlace" }).click();
  await expect(page.getByRole("heading", { name: "Revisa tu correo" })).toBeVisible();
  const message = await mail.waitFor(DEMO.coordinator, (m) => m.subject === "Tu enlace para entrar en Ecotone");
  await page.goto(MailCatcher.linkIn(message));
  await page.getByRole("main").getByRole("button", { name: "Entrar" }).click(); // the confirm page: a scanner opening the link uses nothing
  await expect(page).toHaveURL(/\/es\/account/);
  await expect(page.getByRole("link", { name: /coordinador\/a en Harrowmere Vale Midsummer Count/ })).toBeVisible();
});

test("an address with no account gets the same answer as any other, and a mail telling how to get one", async ({ page, mail }) => {
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
  await page.goto("/en/sign-in");
  const form = page.getByRole("form", { name: "Sign in with a password" });
  await form.getByLabel("E-mail address").fill("volunteer6@example.org");
  for (let i = 0; i < 5; i++) {
    await form.getByLabel("Password").fill(`wrong-${i}-password`);
    await form.getByRole("button", { name: "Sign in" }).click();
    await expect(page.getByRole("alert").filter({ hasText: "do not match" })).toBeVisible();
  }
  // Even the right password is refused now, with the reason.
  await form.getByLabel("Password").fill(DEMO.password);
  await form.getByRole("button", { name: "Sign in" }).click();
  await expect(page.getByRole("alert").filter({ hasText: "Too many sign-in attempts" })).toBeVisible();
});
