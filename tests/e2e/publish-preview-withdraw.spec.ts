import { withE2eDb } from "./demo-ids";
import { DEMO, expect, signInWithPassword, test } from "./support";

// Issue 16: publishing from a preview (same page as the public one, marked, not indexed), with a
// confirmation, a note and the participants' mail held back; withdrawing a version with a reason;
// the results of a draft event for its organiser. The Kestrel Moor event is used so that the
// Harrowmere report versions other specs count are left alone.
const MOOR = "kestrel-moor-winter-count";
const MOOR_ORGANISER = "moor-organiser@example.org";

const publishedMails = () =>
  withE2eDb(async (db) => {
    const { rows } = await db.query<{ n: number }>(
      "SELECT count(*)::int AS n FROM email_outbox WHERE kind = 'report_published' AND subject LIKE 'Kestrel Moor Winter Count%'",
    );
    return rows[0]!.n;
  });

test("organiser previews the report, publishes it with a note and no mail, then withdraws it; the public sees the notice", async ({
  page,
  browser,
}) => {
  test.setTimeout(240_000);
  await signInWithPassword(page, MOOR_ORGANISER);
  await page.goto(`/en/events/${MOOR}/results`);
  await page.getByRole("link", { name: "Preview the next report before publishing" }).click();
  await expect(page.getByRole("heading", { level: 1, name: "Preview — not published" })).toBeVisible({
    timeout: 30_000,
  });
  // The same report page as the public's, never indexed, with the state of the review named.
  await expect(page.locator('meta[name="robots"]')).toHaveAttribute("content", /noindex/);
  await expect(page.getByRole("heading", { name: "Headline numbers" })).toBeVisible();
  const banner = page.getByTestId("preview-banner");
  await expect(banner).toContainText(/Left out of this report: \d+ pending|Every sighting has been decided/);
  await expect(page.getByText("The downloads are made when the report is published.")).toBeVisible();
  const version = Number((await banner.textContent())!.match(/This is version (\d+)/)![1]);

  // Nobody but the organisers sees the preview: a visitor is sent to sign in.
  const visitor = await browser.newContext();
  const anon = await visitor.newPage();
  await anon.goto(`/en/events/${MOOR}/reports/preview`);
  await expect(anon).toHaveURL(/sign-in/);

  // Publishing asks first; "Not yet" leaves everything as it was.
  await page.getByRole("button", { name: "Publish this report…" }).click();
  const dialog = page.getByRole("dialog", { name: `Publish version ${version}?` });
  await expect(dialog).toBeVisible();
  // A keyboard user lands in the confirmation, and Esc or "Not yet" puts them back on the button.
  await expect(dialog).toBeFocused();
  await page.keyboard.press("Escape");
  await expect(dialog).toBeHidden();
  await expect(page.getByRole("button", { name: "Publish this report…" })).toBeFocused();
  await page.keyboard.press("Enter");
  await dialog.getByRole("button", { name: "Not yet" }).click();
  await expect(dialog).toBeHidden();
  await expect(page.getByRole("button", { name: "Publish this report…" })).toBeFocused();
  await page.getByRole("button", { name: "Publish this report…" }).click();
  await dialog.getByLabel("Note on the report page (optional)").fill("Thanks to everyone who braved the moor.");
  const mailsBefore = await publishedMails();
  await dialog.getByLabel("E-mail every participant that the report is published").uncheck();
  await dialog.getByRole("button", { name: "Publish now" }).click();
  await expect(page).toHaveURL(new RegExp(`/en/events/${MOOR}/reports/${version}$`), { timeout: 60_000 });
  await expect(page.getByTestId("report-note")).toContainText("Thanks to everyone who braved the moor.");
  await expect(page.getByRole("link", { name: "Darwin Core Archive (zip)" })).toBeVisible();
  // The mail was held back.
  expect(await publishedMails()).toBe(mailsBefore);

  // Withdraw it with a reason, from the results page.
  await page.goto(`/en/events/${MOOR}/results`);
  await page.getByText(`Withdraw version ${version}`).click();
  await page.getByLabel("Reason for withdrawing (shown on the public page)").fill("The moor zones were swapped.");
  await page.getByRole("button", { name: "Withdraw this version" }).click();
  await expect(page.getByText(`(withdrawn: The moor zones were swapped.)`)).toBeVisible({ timeout: 20_000 });

  // The public page stays, with the notice and the reason; its data and downloads stay too.
  await anon.goto(`/en/events/${MOOR}/reports/${version}`);
  const notice = anon.getByTestId("withdrawn");
  await expect(notice).toContainText("This version was withdrawn");
  await expect(notice).toContainText("Reason: The moor zones were swapped.");
  await expect(anon.getByRole("heading", { name: "Headline numbers" })).toBeVisible();
  await expect(anon.getByRole("link", { name: "Darwin Core Archive (zip)" })).toBeVisible();
  if (version > 1) await expect(anon.getByRole("link", { name: `Previous version (${version - 1})` })).toBeVisible();
  await visitor.close();
});

test("the organiser opens the results of a draft event", async ({ page }) => {
  await signInWithPassword(page, DEMO.organiser);
  await page.goto("/en/events/harrowmere-vale-autumn-fungus-foray/results");
  await expect(page.getByRole("heading", { level: 1 })).toContainText("Results — Harrowmere Vale Autumn Fungus Foray", {
    timeout: 30_000,
  });
});

test("a visitor finds the latest report from the landing page in two clicks", async ({ page, browser }) => {
  test.setTimeout(120_000);
  // A standing (not withdrawn) version of the moor's report, published by its organiser.
  const organiser = await browser.newContext();
  const o = await organiser.newPage();
  await signInWithPassword(o, MOOR_ORGANISER);
  const eventId = await withE2eDb(
    async (db) => (await db.query<{ id: string }>("SELECT id FROM events WHERE slug = $1", [MOOR])).rows[0]!.id,
  );
  const res = await o.request.post(`/api/events/${eventId}/reports`, {
    data: { confirmPending: true, notify: false },
    headers: { origin: new URL(o.url()).origin },
  });
  expect(res.status()).toBe(201);
  const { version } = (await res.json()) as { version: number };
  await organiser.close();

  await page.goto("/en");
  await page.getByRole("link", { name: "Open event page: Kestrel Moor Winter Count" }).click();
  await page.getByRole("link", { name: `Read the latest report (version ${version})` }).click();
  await expect(page.getByRole("heading", { level: 1 })).toHaveText(
    `Kestrel Moor Winter Count — report version ${version}`,
  );
});

test("set-up marks the open tab and refuses to remove a species that sightings use, saying how many", async ({
  page,
}) => {
  test.setTimeout(120_000);
  await signInWithPassword(page, DEMO.organiser);
  await page.goto("/en/events/harrowmere-vale-midsummer-count/setup/species");
  const tabs = page.getByRole("navigation", { name: "Setup sections" });
  await expect(tabs.getByRole("link", { name: "Species list" })).toHaveAttribute("aria-current", "page");
  await expect(tabs.getByRole("link", { name: "Details" })).not.toHaveAttribute("aria-current", "page");
  await page.getByRole("button", { name: "Remove Prunella modularis" }).click();
  await expect(
    page.getByRole("alert").filter({ hasText: /\d+ sightings of this event use this species: it stays on the list\./ }),
  ).toBeVisible();
  await expect(page.getByRole("rowheader", { name: "Prunella modularis" })).toBeVisible();
});
