import { test as base, expect, type Locator, type Page } from "@playwright/test";
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

// The sign-in page's words as a person reads them, in each language.
const SIGN_IN_WORDS = {
  en: {
    passwordForm: "Sign in with a password",
    linkForm: "E-mail me a sign-in link",
    email: "E-mail address",
    password: "Password",
    signIn: "Sign in",
    sendLink: "Send the link",
  },
  es: {
    passwordForm: "Entrar con contraseña",
    linkForm: "Enviarme un enlace para entrar",
    email: "Correo electrónico",
    password: "Contraseña",
    signIn: "Entrar",
    sendLink: "Enviar el enlace",
  },
  fr: {
    passwordForm: "Se connecter avec un mot de passe",
    linkForm: "Recevoir un lien de connexion",
    email: "Adresse e-mail",
    password: "Mot de passe",
    signIn: "Se connecter",
    sendLink: "Envoyer le lien",
  },
} as const;

/** The sign-in page (/<locale>/sign-in) and its two forms, found by their roles and labels. */
export class SignInPage {
  readonly words: (typeof SIGN_IN_WORDS)[keyof typeof SIGN_IN_WORDS];

  constructor(
    readonly page: Page,
    readonly locale: keyof typeof SIGN_IN_WORDS = "en",
  ) {
    this.words = SIGN_IN_WORDS[locale];
  }

  async open(): Promise<this> {
    await this.page.goto(`/${this.locale}/sign-in`);
    return this;
  }

  get passwordForm(): Locator {
    return this.page.getByRole("form", { name: this.words.passwordForm });
  }

  get linkForm(): Locator {
    return this.page.getByRole("form", { name: this.words.linkForm });
  }

  /** Types an address and a password into the password form and sends it. */
  async submitPassword(email: string, password: string): Promise<void> {
    const form = this.passwordForm;
    await form.getByLabel(this.words.email).fill(email);
    await form.getByLabel(this.words.password, { exact: true }).fill(password);
    await form.getByRole("button", { name: this.words.signIn, exact: true }).click();
  }

  /** Asks for a sign-in link by e-mail. */
  async askForLink(email: string): Promise<void> {
    await this.linkForm.getByLabel(this.words.email).fill(email);
    await this.linkForm.getByRole("button", { name: this.words.sendLink }).click();
  }

  /** Signs in with a password and waits for the account page, as a person would. */
  async signIn(email: string, password: string = DEMO_PASSWORD): Promise<void> {
    await this.open();
    await this.submitPassword(email, password);
    await this.page.waitForURL(/\/account/);
  }
}

/** Signs in through the real form, as a person would. */
export async function signInWithPassword(
  page: Page,
  email: string,
  password = DEMO_PASSWORD,
  locale: keyof typeof SIGN_IN_WORDS = "en",
) {
  await new SignInPage(page, locale).signIn(email, password);
}

/**
 * Publishes the event's next report as an organiser does (issue 16): from the results page to
 * the preview, then "Publish" and "Publish now" in its confirmation. Returns the version, once
 * its public page is open.
 */
export async function publishThroughPreview(page: Page, slug: string): Promise<number> {
  await page.goto(`/en/events/${slug}/results`);
  await page.getByRole("link", { name: "Preview the next report before publishing" }).click();
  const banner = page.getByTestId("preview-banner");
  // The preview computes the report from every record: allow for a loaded machine.
  await expect(banner).toBeVisible({ timeout: 60_000 });
  const version = Number((await banner.textContent())!.match(/This is version (\d+)/)![1]);
  await page.getByRole("button", { name: "Publish this report…" }).click();
  await page
    .getByRole("dialog", { name: `Publish version ${version}?` })
    .getByRole("button", { name: "Publish now" })
    .click();
  await expect(page).toHaveURL(new RegExp(`/en/events/${slug}/reports/${version}$`), { timeout: 60_000 });
  return version;
}
