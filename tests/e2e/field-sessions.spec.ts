import type { Page } from "@playwright/test";
import { DEMO, expect, signInWithPassword, test } from "./support";
import { withE2eDb } from "./demo-ids";

// Issue 15 on a phone (390×844): the field log starts near the top under a one-line header;
// the species list is there before any typing; a record the server would refuse is refused at
// save with the server's words and nothing is queued; a focused field stays clear of the Save
// bar; a count session ends with its summary, is edited and then cancelled, and its sighting
// stays on the server without a session.

const KESTREL = "Kestrel Moor Winter Count";
test.describe.configure({ timeout: 180_000 });
test.use({
  viewport: { width: 390, height: 844 },
  isMobile: true,
  hasTouch: true,
  geolocation: { latitude: 53.3045, longitude: -2.095, accuracy: 8 },
  permissions: ["geolocation"],
});

/** How many sightings the phone holds (IndexedDB), sent or not. */
const queuedSightings = (page: Page) =>
  page.evaluate(
    () =>
      new Promise<number>((resolve, reject) => {
        const open = indexedDB.open("ecotone-field");
        open.onsuccess = () => {
          const r = open.result.transaction("sightings").objectStore("sightings").count();
          r.onsuccess = () => {
            open.result.close();
            resolve(r.result);
          };
          r.onerror = () => reject(r.error);
        };
        open.onerror = () => reject(open.error);
      }),
  );

async function openEvent(page: Page) {
  await page.goto("/en/field");
  const pick = page.getByRole("button", { name: new RegExp(KESTREL) });
  const heading = page.getByRole("heading", { level: 2, name: KESTREL });
  await expect(pick.or(heading)).toBeVisible({ timeout: 20_000 });
  if (await pick.isVisible()) await pick.click();
  await expect(heading).toBeVisible();
  await expect(page.getByRole("button", { name: "Add sighting" })).toBeEnabled({ timeout: 20_000 });
}

test("on a phone: one-line header, checks at save, a session's summary, edit and cancel", async ({ page }) => {
  await signInWithPassword(page, DEMO.volunteer);
  await openEvent(page);

  // The header is one line (a menu button holds the links); the field log starts in the first third.
  const header = (await page.getByRole("banner").boundingBox())!;
  expect(header.height).toBeLessThanOrEqual(72);
  await expect(page.getByRole("link", { name: "Account" })).toBeHidden();
  await page.getByRole("button", { name: "Menu" }).click();
  await expect(page.getByRole("link", { name: "Account" })).toBeVisible();
  await page.getByRole("button", { name: "Menu" }).click();
  const title = (await page.getByRole("heading", { level: 1, name: "Field log" }).boundingBox())!;
  const event = (await page.getByRole("heading", { level: 2, name: KESTREL }).boundingBox())!;
  expect(title.y).toBeLessThan(844 / 3);
  expect(event.y).toBeLessThan(844 / 3);

  await page.getByRole("radio", { name: "Point count" }).check();
  await page.getByRole("button", { name: "Start session" }).click();
  await expect(page.getByRole("heading", { name: "Point count running" })).toBeVisible();

  const before = await queuedSightings(page);
  await page.getByRole("button", { name: "Add sighting" }).click();
  const form = page.getByRole("form", { name: "New sighting" });
  // Before any typing the list already offers species (recent ones, then the event's most recorded).
  await expect(form.getByRole("list", { name: "Matching species" }).getByRole("button").first()).toBeVisible();
  await form.getByRole("searchbox", { name: "Species" }).fill("stonechat");
  await form
    .getByRole("list", { name: "Matching species" })
    .getByRole("button", { name: /stonechat/i })
    .first()
    .click();
  await expect(form.getByText(/From the phone: 53\.30450/)).toBeVisible();

  // A count above the limit: refused at save with the server's own words, nothing queued.
  await form.getByRole("spinbutton", { name: "Count" }).fill("2000000");
  await form.getByRole("button", { name: "Save sighting" }).click();
  await expect(form.getByRole("alert")).toContainText(
    "The count is above 1,000,000. Check the number, or split a very large count into several sightings.",
  );
  await expect(form).toBeVisible();
  expect(await queuedSightings(page)).toBe(before);
  await form.getByRole("spinbutton", { name: "Count" }).fill("2");

  // The focused field is never behind the sticky Save bar.
  const notes = form.getByLabel("Notes");
  await notes.focus();
  const bar = (await form.getByRole("button", { name: "Save sighting" }).boundingBox())!;
  const box = (await notes.boundingBox())!;
  expect(box.y + box.height).toBeLessThanOrEqual(bar.y);
  await notes.fill("On the gorse by the ridge path");

  await form.getByRole("button", { name: "Save sighting" }).click();
  await expect(form).toBeHidden();

  // Ending the session shows its summary.
  await page.getByRole("button", { name: "End session" }).click();
  const end = page.getByRole("form", { name: "End the count session" });
  await end.getByRole("radio", { name: "Yes, the list is full" }).check();
  await end.getByRole("button", { name: "End session" }).click();
  const summary = page.getByRole("region", { name: "Session ended: Point count" });
  await expect(summary).toBeVisible();
  await expect(summary.getByRole("definition")).toHaveText([/^\d+ minutes?$/, "1", "1", "2", /^\d+$/]);
  await summary.getByRole("button", { name: "Done" }).click();
  await expect(summary).toBeHidden();
  await expect(page.getByText("Everything is sent.")).toBeVisible({ timeout: 30_000 });

  const sessions = page.getByRole("list", { name: "Your count sessions" });
  const label = "Point count · Heather Crest";
  await expect(sessions.getByRole("listitem").filter({ hasText: label })).toHaveCount(1);
  const stored = await withE2eDb(async (c) => {
    const { rows } = await c.query(
      `SELECT s.id::text AS sighting, s.session_id::text AS session FROM sightings s WHERE s.notes = 'On the gorse by the ridge path'`,
    );
    return rows[0] as { sighting: string; session: string | null };
  });
  expect(stored.session).not.toBeNull();

  // Edit the session: another zone.
  await sessions.getByRole("button", { name: `Edit session: ${label}` }).click();
  const editor = page.getByRole("form", { name: "Edit the count session" });
  await editor.getByLabel("Zone").selectOption({ label: "Gorse Margin" });
  await editor.getByRole("button", { name: "Save session" }).click();
  await expect(editor).toBeHidden();
  const edited = "Point count · Gorse Margin";
  await expect(sessions.getByRole("listitem").filter({ hasText: edited })).toHaveCount(1);
  await expect(page.getByText("Everything is sent.")).toBeVisible({ timeout: 30_000 });
  await expect
    .poll(() =>
      withE2eDb(
        async (c) =>
          (
            await c.query(`SELECT z.name FROM count_sessions s JOIN zones z ON z.id = s.zone_id WHERE s.id = $1`, [
              stored.session,
            ])
          ).rows[0]?.name as string | undefined,
      ),
    )
    .toBe("Gorse Margin");

  // Cancel it: the confirmation says what becomes of its sighting.
  await sessions.getByRole("button", { name: `Cancel session: ${edited}` }).click();
  const confirm = page.getByRole("group", { name: "Cancel session" });
  await expect(confirm).toContainText(
    "Cancel this count session? Its 1 sighting stays, as a sighting outside a session.",
  );
  await confirm.getByRole("button", { name: "Yes, cancel the session" }).click();
  await expect(page.getByRole("status").filter({ hasText: "Session cancelled." })).toContainText(
    "1 sighting is now outside a session.",
  );
  await expect(page.getByRole("list", { name: "Your count sessions" })).toHaveCount(0);
  await expect(page.getByText("Everything is sent.")).toBeVisible({ timeout: 30_000 });

  await expect
    .poll(() =>
      withE2eDb(async (c) => ({
        sessions: (await c.query(`SELECT count(*)::int AS n FROM count_sessions WHERE id = $1`, [stored.session]))
          .rows[0].n as number,
        sighting: (await c.query(`SELECT session_id FROM sightings WHERE id = $1`, [stored.sighting])).rows[0] as {
          session_id: string | null;
        },
      })),
    )
    .toEqual({ sessions: 0, sighting: { session_id: null } });
});

test("someone who joined a draft event sees in the field log when recording opens, and cannot record yet", async ({
  page,
}) => {
  // Owen Pritchard is a volunteer of the autumn foray, still in preparation (db/seed/demo-scenario.ts).
  await signInWithPassword(page, "volunteer2@example.org");
  await page.goto("/en/field");
  const pick = page.getByRole("button", { name: /Harrowmere Vale Autumn Fungus Foray/ });
  const heading = page.getByRole("heading", { level: 2, name: "Harrowmere Vale Autumn Fungus Foray" });
  await expect(pick.or(heading)).toBeVisible();
  if (await pick.isVisible()) await pick.click();
  await expect(heading).toBeVisible();
  // 08:00 UTC on 16 October 2027, written in the event's time zone.
  await expect(page.getByText(/has not opened for records yet: recording starts on .*2027/)).toBeVisible();
  await expect(page.getByRole("button", { name: "Add sighting" })).toBeDisabled();
});
