import { demoId } from "../../db/seed/random";
import { withE2eDb } from "./demo-ids";
import { DEMO, expect, signInWithPassword, test } from "./support";

// The desk's ways back and its other forms: filters in the URL (reload, back button), undo
// from the toast and from the history, re-identify and approve by keyboard in one decision,
// and the two-view desk on a phone. Uses the two "possible duplicate" nuthatches of the
// midsummer count, and leaves them pending as they were.
const caseId = (key: string) => demoId(`review-case:${key}`);
const DESK = "/en/events/harrowmere-vale-midsummer-count/review";

test("filters live in the URL, and every decision can be undone from the toast or the history", async ({ page }) => {
  test.setTimeout(120_000);
  await signInWithPassword(page, DEMO.coordinator);
  await page.goto(`${DESK}?marks=possible_duplicate`);
  const queue = page.getByRole("table", { name: "Queue" });
  const rows = queue.getByRole("row").filter({ has: page.getByRole("cell") });
  await expect(rows).toHaveCount(2);
  // Each row is announced as taxon, count, volunteer, time and state.
  await expect(rows.first()).toHaveAccessibleName(
    "Eurasian nuthatch, count 1, Bastien Lefèvre, 21/06/2026, 11:33, Pending",
  );

  // The filters survive a reload, and the back button returns to the previous ones.
  await page.reload();
  await expect(page.getByLabel("Check mark")).toHaveValue("possible_duplicate");
  await expect(rows).toHaveCount(2);
  await page.getByLabel("Review state").selectOption({ label: "Any" });
  await expect(page).toHaveURL(/state=any/);
  await page.goBack();
  await expect(page).not.toHaveURL(/state=any/);
  await expect(page.getByLabel("Review state")).toHaveValue("pending");
  await expect(page.getByLabel("Check mark")).toHaveValue("possible_duplicate");
  await expect(rows).toHaveCount(2);

  // "/" goes to the filters; Esc and a click leave them.
  await page.getByRole("heading", { level: 1, name: "Review desk" }).click();
  await page.keyboard.press("/");
  await expect(page.getByLabel("Review state")).toBeFocused();
  await page.getByRole("heading", { level: 1, name: "Review desk" }).click();

  // Approve, then undo from the toast (the U key).
  await page.keyboard.press("j");
  await page.keyboard.press("y");
  const toast = page.getByRole("status");
  await expect(toast).toContainText("Approved: Eurasian nuthatch, 21 June 11:33, Bastien Lefèvre");
  await expect(rows).toHaveCount(1);
  await page.keyboard.press("u");
  await expect(toast).toContainText("Undone: Eurasian nuthatch, 21 June 11:33, Bastien Lefèvre");
  await expect(rows).toHaveCount(2);
  const b = caseId("duplicate:b");
  const stored = () =>
    withE2eDb(async (c) => {
      const s = await c.query<{ review_state: string; scientific_name: string }>(
        "SELECT s.review_state, t.scientific_name FROM sightings s JOIN taxa t ON t.id = s.taxon_id WHERE s.id = $1",
        [b],
      );
      const r = await c.query<{ to_state: string; undoes_id: string | null }>(
        "SELECT to_state, undoes_id FROM reviews WHERE sighting_id = $1 ORDER BY id",
        [b],
      );
      return { ...s.rows[0]!, reviews: r.rows };
    });
  let now = await stored();
  expect(now.review_state).toBe("pending");
  expect(now.reviews.map((r) => [r.to_state, r.undoes_id !== null])).toEqual([
    ["approved", false],
    ["pending", true],
  ]);

  // Re-identify and approve in one decision, by keyboard: T opens the picker, arrows and Enter choose.
  // The undone sighting is back in the list, still selected.
  await expect(rows.first()).toHaveAttribute("aria-selected", "true");
  await page.keyboard.press("t");
  const picker = page.getByRole("combobox", { name: "New taxon (type at least 2 letters)" });
  await expect(picker).toBeFocused();
  await page.keyboard.type("dunn");
  const options = page.getByRole("listbox", { name: "Taxa found" }).getByRole("option");
  await expect(options.first()).toHaveText(/Dunnock \(Prunella modularis\)/);
  await page.keyboard.press("ArrowDown");
  await page.keyboard.press("ArrowUp");
  await expect(options.first()).toHaveAttribute("aria-selected", "true");
  await page.keyboard.press("Enter");
  await expect(page.getByRole("button", { name: "Re-identify and approve" })).toBeFocused();
  await page.keyboard.press("Enter");
  await expect(toast).toContainText(
    "Re-identified and approved: Dunnock (Prunella modularis), 21 June 11:33, Bastien Lefèvre",
  );
  now = await stored();
  expect(now).toMatchObject({ review_state: "approved", scientific_name: "Prunella modularis" });
  expect(now.reviews).toHaveLength(3);

  // Later, from the history: show every state, open the sighting, undo its latest decision.
  // (A dunnock is no duplicate of the other nuthatch: its mark is gone, so look by state and volunteer.)
  await page.getByLabel("Check mark").selectOption({ label: "Any" });
  await expect(page).not.toHaveURL(/marks=/);
  await page.getByLabel("Review state").selectOption({ label: "Approved" });
  await expect(page).toHaveURL(/state=approved/);
  await page.locator("#f-volunteer").selectOption({ label: "Bastien Lefèvre" });
  await expect(page).toHaveURL(/volunteer=/);
  await rows.filter({ hasText: "21/06/2026, 11:33" }).filter({ hasText: "Dunnock" }).getByRole("button").click();
  await page.getByRole("button", { name: "Undo this decision" }).click();
  await expect(toast).toContainText("Undone: Dunnock");
  now = await stored();
  expect(now).toMatchObject({ review_state: "pending", scientific_name: "Sitta europaea" });
  expect(now.reviews.map((r) => r.to_state)).toEqual(["approved", "pending", "approved", "pending"]);
  // Pending again, it leaves the "Approved" list.
  await expect(rows.filter({ hasText: "Dunnock" }).filter({ hasText: "21/06/2026, 11:33" })).toHaveCount(0);
});

test("on a phone the desk is two views, queue then sighting and back, without the key list", async ({ browser }) => {
  const phone = await browser.newContext({ viewport: { width: 390, height: 844 }, hasTouch: true, isMobile: true });
  const page = await phone.newPage();
  await signInWithPassword(page, DEMO.coordinator);
  await page.goto(`${DESK}?marks=possible_duplicate`);
  const queue = page.getByRole("table", { name: "Queue" });
  await expect(queue.getByRole("row").filter({ has: page.getByRole("cell") })).toHaveCount(2);
  await expect(page.getByRole("complementary", { name: "Keyboard" })).toBeHidden();
  // Nothing is cut off sideways.
  expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
  await queue.getByRole("row").nth(1).getByRole("button").click();
  await expect(page.getByRole("heading", { level: 2, name: /Eurasian nuthatch/ })).toBeVisible();
  await expect(queue).toBeHidden();
  await expect(page.locator('button[aria-keyshortcuts="y"]')).toBeVisible();
  await page.getByRole("button", { name: "Back to the queue" }).click();
  await expect(queue).toBeVisible();
  expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
  await phone.close();
});
