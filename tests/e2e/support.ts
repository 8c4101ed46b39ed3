import { test as base, expect, type Page } from "@playwright/test";
import { DEMO_PASSWORD } from "../../db/seed/demo-scenario";
import { MailCatcher } from "../support/mail-catcher";

// One SMTP catcher per Playwright worker, on the port the server sends to.
const SMTP_PORT = Number(process.env.E2E_SMTP_PORT ?? 2525);

export const test = base.extend<{ mail: MailCatcher }, { mailWorker: MailCatcher }>({
  mailWorker: [
    async ({}, use) => {
      const catcher = new MailCatcher(SMTP_PORT);
      await catcher.start();
      await use(catcher);
      await catcher.stop();
    },
    { scope: "worker" },
  ],
  mail: async ({ mailWorker }, use) => use(mailWorker),
});
export { expect };

export const DEMO = {
  organiser: "organiser@example.org",
  coordinator: "coordinator@example.org",
  birdsCoordinator: "birds@example.org",
  volunteer: "volunteer1@example.org",
  password: DEMO_PASSWORD,
};

/** Signs in through the real form, as a person would. */
export async function signInWithPassword(page: Page, email: string, password = DEMO_PASSWORD, locale = "en") {
  await page.goto(`/${locale}/sign-in`);
  const form = page.getByRole("form", { name: locale === "en" ? "Sign in with a password" : /contraseña|mot de passe/ });
  await form.getByLabel(locale === "en" ? "E-mail address" : /Correo|Adresse/).fill(email);
  await form.getByLabel(locale === "en" ? "Password" : /Contraseña|Mot de passe/).fill(password);
  await form.getByRole("button").click();
  await page.waitForURL(/\/account/);
}
