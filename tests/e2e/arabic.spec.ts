import ar from "../../messages/ar.json";
import { DEMO, expect, signInWithPassword, test } from "./support";

// The field log and the review desk walked in Arabic (right to left): a volunteer records a
// transect walk with one sighting and a full list; the organiser rejects it at the desk.
const SLUG = "kestrel-moor-winter-count";
const EVENT = "Kestrel Moor Winter Count";
test.describe.configure({ timeout: 240_000 });
test.use({ geolocation: { latitude: 53.3045, longitude: -2.095, accuracy: 8 }, permissions: ["geolocation"] });

test("a volunteer records and an organiser decides, both in Arabic", async ({ page, browser }) => {
  const f = ar.FieldLog;
  await signInWithPassword(page, DEMO.volunteer);
  await page.goto("/ar/field");
  await expect(page.locator("html")).toHaveAttribute("dir", "rtl");
  await expect(page.locator("html")).toHaveAttribute("lang", "ar");
  const pick = page.getByRole("button", { name: new RegExp(EVENT) });
  const heading = page.getByRole("heading", { level: 2, name: EVENT });
  await expect(pick.or(heading)).toBeVisible();
  if (await pick.isVisible()) await pick.click();
  await expect(page.getByRole("button", { name: f.addSighting })).toBeEnabled({ timeout: 20_000 });
  await expect(page.getByRole("region", { name: ar.Safety.title })).toBeVisible();
  await expect(page.getByRole("note").filter({ hasText: f.session.safetyReminder })).toBeVisible();

  await page.getByRole("radio", { name: f.sessionKind.walk }).check();
  await page.getByRole("button", { name: f.session.start }).click();
  await expect(
    page.getByRole("heading", { name: f.session.running.replace("{kind}", f.sessionKind.walk) }),
  ).toBeVisible();

  await page.getByRole("button", { name: f.addSighting }).click();
  const form = page.getByRole("form", { name: f.addTitle });
  await form.getByRole("searchbox", { name: f.species }).fill("Turdus merula");
  await form
    .getByRole("list", { name: f.speciesResults })
    .getByRole("button", { name: /Turdus merula/ })
    .first()
    .click();
  await form.getByRole("button", { name: f.countMore }).click();
  await form.getByLabel(f.notes).fill("على حافة الطريق");
  await form.getByRole("button", { name: f.save }).click();
  await expect(form).toBeHidden();

  await page.getByRole("button", { name: f.session.end, exact: true }).click();
  const end = page.getByRole("form", { name: f.session.endTitle });
  await expect(end.getByText(f.session.allNotedQuestion)).toBeVisible();
  await expect(end.getByText(f.session.allNotedHint)).toBeVisible();
  await end.getByRole("radio", { name: f.session.allNotedYes }).check();
  await end.getByLabel(f.session.distance).fill("400");
  await end.getByRole("button", { name: f.session.confirmEnd }).click();
  await expect(page.getByText(f.outboxEmpty, { exact: true })).toBeVisible({ timeout: 30_000 });

  // The organiser of the moor event decides it at the review desk, in Arabic.
  const d = ar.ReviewDesk;
  const context = await browser.newContext();
  const desk = await context.newPage();
  await signInWithPassword(desk, "moor-organiser@example.org");
  await desk.goto(`/ar/events/${SLUG}/review`);
  await expect(desk.locator("html")).toHaveAttribute("dir", "rtl");
  await expect(desk.getByRole("heading", { level: 1, name: d.title })).toBeVisible();
  await desk.getByLabel(d.filters.volunteer).selectOption({ label: "Priya Nandakumar" });
  await desk.getByLabel(d.filters.order).selectOption({ label: d.filters.newest });
  const rows = desk
    .getByRole("table", { name: d.queue.title })
    .getByRole("row")
    .filter({ has: desk.getByRole("cell") });
  await expect(rows.first()).toContainText("Turdus merula", { timeout: 20_000 });
  // The row's own button opens it; a click that lands before the desk has hydrated opens
  // nothing, so the click is repeated until the detail shows the note.
  await expect(async () => {
    await rows.first().getByRole("button").first().click();
    await expect(desk.getByText("على حافة الطريق")).toBeVisible({ timeout: 2_000 });
  }).toPass({ timeout: 20_000 });
  await desk.getByRole("button", { name: new RegExp(`^${d.actions.reject}`) }).click();
  const reject = desk.getByRole("form", { name: d.actions.reject });
  await reject.getByLabel(d.actions.reason).selectOption({ label: d.reasons.misidentified });
  await reject.getByRole("button", { name: d.actions.submit }).click();
  // The toast names the record: "Rejected: <taxon>, <time>, <volunteer>" in Arabic.
  const rejected = d.actions.done.reject.split(":")[0]!.trim();
  await expect(desk.getByRole("status").filter({ hasText: rejected })).toBeVisible({ timeout: 20_000 });
  await context.close();
});
