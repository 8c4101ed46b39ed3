import type { Page } from "@playwright/test";
import { DEMO, expect, signInWithPassword, test } from "./support";
import { withE2eDb } from "./demo-ids";

// Issue 15 on a phone (390×844): a volunteer puts records right (corrects a sent sighting,
// deletes one still waiting, answers a question after the event closed) and the outbox
// leaves within seconds of the connection's return, with a status that says so.

const KESTREL = "Kestrel Moor Winter Count";
const HARROWMERE = "Harrowmere Vale Midsummer Count";
test.describe.configure({ timeout: 180_000 });
test.use({
  viewport: { width: 390, height: 844 },
  isMobile: true,
  hasTouch: true,
  geolocation: { latitude: 53.3045, longitude: -2.095, accuracy: 8 },
  permissions: ["geolocation"],
});

async function openEvent(page: Page, name: string, ready = true) {
  await page.goto("/en/field");
  const pick = page.getByRole("button", { name: new RegExp(name) });
  const heading = page.getByRole("heading", { level: 2, name });
  await expect(pick.or(heading)).toBeVisible({ timeout: 20_000 });
  if (await pick.isVisible()) await pick.click();
  await expect(heading).toBeVisible();
  if (ready) await expect(page.getByRole("button", { name: "Add sighting" })).toBeEnabled({ timeout: 20_000 });
}

async function addSighting(page: Page, query: string, pick: RegExp) {
  await page.getByRole("button", { name: "Add sighting" }).click();
  const form = page.getByRole("form", { name: "New sighting" });
  await form.getByRole("searchbox", { name: "Species" }).fill(query);
  await form.getByRole("list", { name: "Matching species" }).getByRole("button", { name: pick }).first().click();
  await expect(form.getByText(/From the phone: 53\.30450/)).toBeVisible();
  await form.getByRole("button", { name: "Save sighting" }).click();
  await expect(form).toBeHidden();
}

const sent = (page: Page) => page.getByRole("list", { name: "Sent" });
const outbox = (page: Page) => page.getByRole("list", { name: "On this phone" });

test("a sent pending sighting is corrected on the phone and the desk shows the new version", async ({
  page,
  browser,
}) => {
  await signInWithPassword(page, DEMO.volunteer);
  await openEvent(page, KESTREL);
  await addSighting(page, "wren", /Eurasian wren/);
  await expect(page.getByText("Everything is sent.")).toBeVisible({ timeout: 30_000 });
  const row = sent(page).getByRole("listitem").filter({ hasText: "Eurasian wren" }).first();
  await expect(row).toContainText("Pending");

  await row.getByRole("button", { name: "Correct: Eurasian wren" }).click();
  const form = page.getByRole("form", { name: "Edit sighting" });
  await expect(page.getByRole("heading", { name: "Correct a sent sighting" })).toBeVisible();
  await form.getByRole("button", { name: "One more" }).click();
  await form.getByLabel("Notes").fill("A second one answered from the gorse");
  await form.getByRole("button", { name: "Save sighting" }).click();
  await expect(form).toBeHidden();
  await expect(page.getByText("Everything is sent.")).toBeVisible({ timeout: 30_000 });

  const stored = await withE2eDb(async (c) => {
    const { rows } = await c.query(
      `SELECT s.id, s.version, s.count, s.review_state AS state, (SELECT count(*)::int FROM sighting_versions v WHERE v.sighting_id = s.id) AS versions
       FROM sightings s WHERE s.notes = 'A second one answered from the gorse'`,
    );
    return rows[0] as { id: string; version: number; count: number; state: string; versions: number };
  });
  expect(stored).toMatchObject({ version: 2, count: 2, state: "pending", versions: 1 });

  // The coordinator's desk: the sighting at version 2, its history saying what changed.
  await withE2eDb((c) =>
    c.query(
      `INSERT INTO event_members (event_id, user_id, role)
       SELECT e.id, u.id, 'coordinator' FROM events e, users u WHERE e.slug = 'kestrel-moor-winter-count' AND u.email = $1
       ON CONFLICT DO NOTHING`,
      [DEMO.coordinator],
    ),
  );
  const desk = await browser.newContext();
  const coord = await desk.newPage();
  await signInWithPassword(coord, DEMO.coordinator);
  await coord.goto("/en/events/kestrel-moor-winter-count/review");
  const rows = coord.getByRole("table", { name: "Queue" }).getByRole("row").filter({ hasText: "Eurasian wren" });
  await expect(rows.first()).toBeVisible({ timeout: 20_000 });
  const n = await rows.count();
  let found = false;
  for (let i = 0; i < n && !found; i++) {
    await rows.nth(i).click();
    found = await coord
      .getByText("A second one answered from the gorse")
      .first()
      .waitFor({ state: "visible", timeout: 5_000 })
      .then(
        () => true,
        () => false,
      );
  }
  expect(found).toBe(true);
  await expect(coord.getByText("Version 2")).toBeVisible();
  await expect(coord.getByText(/count: 1 → 2/)).toBeVisible();
  await desk.close();
});

test("a waiting record is deleted after a confirmation; back online the outbox empties within 5 s", async ({
  page,
  context,
}) => {
  await signInWithPassword(page, DEMO.volunteer);
  await openEvent(page, KESTREL);
  await page.waitForFunction(() => navigator.serviceWorker.controller !== null, undefined, { timeout: 20_000 });

  await context.setOffline(true);
  await expect(page.getByText("No connection — records stay safe on this phone")).toBeVisible({ timeout: 10_000 });
  await addSighting(page, "robin", /European robin/);
  await addSighting(page, "chaffinch", /Common chaffinch/);
  await expect(outbox(page).getByRole("listitem")).toHaveCount(2);
  // "Send now" whenever something waits, even while offline.
  await expect(page.getByRole("button", { name: "Send now" })).toBeVisible();

  const robin = outbox(page).getByRole("listitem").filter({ hasText: "European robin" });
  await robin.getByRole("button", { name: "Delete: European robin" }).click();
  await expect(robin.getByText("Delete this record? It has not been sent, so it will be gone for good.")).toBeVisible();
  await robin.getByRole("button", { name: "Keep it" }).click();
  await expect(outbox(page).getByRole("listitem")).toHaveCount(2);
  await robin.getByRole("button", { name: "Delete: European robin" }).click();
  await robin.getByRole("button", { name: "Delete", exact: true }).click();
  await expect(outbox(page).getByRole("listitem")).toHaveCount(1);
  await expect(page.getByText("1 record still on this phone")).toBeVisible();

  const back = Date.now();
  await context.setOffline(false);
  await expect(page.getByText("Everything is sent.")).toBeVisible({ timeout: 5_000 });
  expect(Date.now() - back).toBeLessThan(5_000);
  const status = page.getByRole("status").filter({ hasText: "Everything is sent." });
  await expect(status).toContainText("Online");
  await expect(status).not.toContainText("No connection");
});

test("a question is answered after the event closed, within its review period", async ({ page }) => {
  // A pending sighting of the volunteer's at the closed event, returned with a question;
  // the organiser keeps review open for another month.
  const question = "Was it singing, or only calling?";
  const id = await withE2eDb(async (c) => {
    await c.query(
      `UPDATE events SET review_closes_at = now() + interval '30 days' WHERE slug = 'harrowmere-vale-midsummer-count'`,
    );
    const { rows } = await c.query(
      `SELECT s.id, s.version FROM sightings s JOIN events e ON e.id = s.event_id JOIN users u ON u.id = s.user_id
       WHERE e.slug = 'harrowmere-vale-midsummer-count' AND u.email = $1 AND s.review_state = 'pending' AND s.taxon_id IS NOT NULL
       ORDER BY s.id LIMIT 1`,
      [DEMO.volunteer],
    );
    const s = rows[0] as { id: string; version: number };
    const coord = (await c.query(`SELECT id FROM users WHERE email = $1`, [DEMO.coordinator])).rows[0].id;
    await c.query(
      `INSERT INTO reviews (sighting_id, event_id, reviewer_id, from_state, to_state, message)
       SELECT $1, event_id, $2, 'pending', 'returned', $3 FROM sightings WHERE id = $1`,
      [s.id, coord, question],
    );
    await c.query(`UPDATE sightings SET review_state = 'returned', version = version + 1 WHERE id = $1`, [s.id]);
    return s.id;
  });

  await signInWithPassword(page, DEMO.volunteer);
  await openEvent(page, HARROWMERE, false);
  await expect(page.getByText("This event is not open for records now.")).toBeVisible();
  await expect(page.getByText(/Answers to coordinators' questions and corrections are taken until/)).toBeVisible();
  const asked = page.getByRole("listitem").filter({ hasText: question });
  await expect(asked).toBeVisible({ timeout: 30_000 });
  await asked.getByRole("button", { name: /^Answer: / }).click();
  const form = page.getByRole("form", { name: "Edit sighting" });
  await form.getByLabel("Your answer").fill("Singing from the willow, twice.");
  await form.getByRole("button", { name: "Save answer" }).click();
  await expect(form).toBeHidden();
  await expect(page.getByText("Everything is sent.")).toBeVisible({ timeout: 30_000 });

  const after = await withE2eDb(
    async (c) =>
      (await c.query(`SELECT review_state AS state FROM sightings WHERE id = $1`, [id])).rows[0] as { state: string },
  );
  expect(after.state).toBe("pending");
  await expect(page.getByRole("listitem").filter({ hasText: question })).toHaveCount(0);
});
