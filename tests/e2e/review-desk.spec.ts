import { Client } from "pg";
import { demoId } from "../../db/seed/random";
import { E2E_DB_URL, withE2eDb } from "./demo-ids";
import { DEMO, expect, signInWithPassword, test } from "./support";

// The birds coordinator at the review desk, by keyboard as far as it goes: only bird
// sightings; the "outside the event area" mark as a filter; approve, reject with a reason,
// return with a question; bulk approve of a filtered set of ten; the volunteers' digests.
const caseId = (key: string) => demoId(`review-case:${key}`);

test("a coordinator limited to birds decides the queue by keyboard and the volunteers get their digests", async ({
  page,
  mail,
  browser,
}) => {
  test.setTimeout(180_000);
  await signInWithPassword(page, DEMO.birdsCoordinator);
  // The birds coordinator also helps at the autumn foray: open the desk of the midsummer count.
  await page
    .getByRole("listitem")
    .filter({ hasText: "Harrowmere Vale Midsummer Count" })
    .getByRole("link", { name: "Open the review desk" })
    .click();
  await expect(page.getByRole("heading", { level: 1, name: "Review desk" })).toBeVisible();
  await expect(page.getByText("You review these taxon groups only: Birds.")).toBeVisible();
  await expect(page.getByText("Times are shown in the event's time zone (Europe/London).")).toBeVisible();
  const keys = page.getByRole("complementary", { name: "Keyboard" });
  // The keys are documented on screen, each beside its key (from the one DESK_KEYS table).
  await expect(keys.getByRole("listitem").first()).toBeVisible();
  const listed = await keys.getByRole("listitem").allTextContents();
  for (const [k, what] of [
    ["j", "next sighting"],
    ["y", "approve"],
    ["x", "reject with a reason"],
    ["q", "return with a question"],
    ["t", "re-identify (choose another taxon)"],
    ["u", "undo the last decision"],
    ["Shift+B", "approve all that match"],
    ["/", "go to the filters"],
    ["?", "show or hide these keys"],
    ["Esc", "close a form or dialog"],
  ] as const)
    expect(listed).toContain(`${k}${what}`);

  const queue = page.getByRole("table", { name: "Queue" });
  const rows = queue.getByRole("row").filter({ has: page.getByRole("cell") });
  await expect(rows.first()).toBeVisible();
  const shown = await rows.count();
  expect(shown).toBeGreaterThan(10);
  for (let i = 0; i < shown; i++) await expect(rows.nth(i)).toContainText("Birds");
  await expect(queue).not.toContainText("Vascular plants");

  // Filter by the mark: three pending bird sightings outside the area (the nettle outside it is not a bird).
  await page.getByLabel("Check mark").selectOption({ label: "Outside the event area" });
  await expect(rows).toHaveCount(3);
  await expect(queue).not.toContainText("Common nettle");
  for (let i = 0; i < 3; i++) await expect(rows.nth(i)).toContainText("Outside the event area");
  await page.getByRole("heading", { level: 1, name: "Review desk" }).click(); // leave the select, as a keyboard user would with Tab

  // Approve the first by keyboard: J selects, Y approves.
  await page.keyboard.press("j");
  await expect(rows.first()).toHaveAttribute("aria-selected", "true");
  await expect(page.getByRole("heading", { level: 2, name: /Common chaffinch/ })).toBeVisible();
  await expect(page.getByRole("region", { name: "Map of the event area and zones with this sighting" })).toBeVisible();

  // Meanwhile the sighting changes under the coordinator (another session moved its version):
  // the optimistic approval is refused with the conflict message and rolled back.
  const admin = new Client({ connectionString: E2E_DB_URL });
  await admin.connect();
  await admin.query("UPDATE sightings SET version = version + 1 WHERE id = $1", [caseId("outside-area:3")]);
  await admin.end();
  await page.keyboard.press("y");
  await expect(page.getByRole("status")).toContainText(
    "Not saved, shown as it was: Someone else decided this sighting first: it is now Pending (version 2).",
  );
  await expect(rows).toHaveCount(3);
  await expect(rows.first()).toHaveAttribute("aria-selected", "true");
  // The desk reloaded the sighting; the second try goes through.
  await expect(page.getByText("Version 2", { exact: true })).toBeVisible();
  await page.keyboard.press("y");
  // The toast names the record, in the event's region (Europe/London: 24-hour, day before month).
  await expect(page.getByRole("status")).toContainText("Approved: Common chaffinch, 21 June 08:40, ");
  await expect(rows).toHaveCount(2);

  // Reject the next with a reason: X opens the form with the reason list focused.
  await expect(page.getByRole("heading", { level: 2, name: /Common blackbird/ })).toBeVisible();
  await page.keyboard.press("x");
  await expect(page.getByLabel("Reason")).toBeFocused();
  await page.getByLabel("Reason").selectOption({ label: "Outside the event (place or time)" });
  await page.getByLabel("Note to the volunteer (optional)").fill("The lane is outside the reserve boundary.");
  await page.getByRole("button", { name: "Save decision" }).click();
  await expect(page.getByRole("status")).toContainText("Rejected: Common blackbird, 21 June 08:25, ");
  await expect(rows).toHaveCount(1);

  // Return the last with a question: Q opens the question box.
  await expect(page.getByRole("heading", { level: 2, name: /European robin/ })).toBeVisible();
  await page.getByRole("heading", { level: 1, name: "Review desk" }).click();
  await page.keyboard.press("q");
  const question = "Were you standing inside the reserve when you heard it?";
  await expect(page.getByLabel("Question to the volunteer")).toBeFocused();
  await page.keyboard.type(question);
  await page.getByRole("button", { name: "Save decision" }).click();
  await expect(page.getByRole("status")).toContainText("Returned with a question: European robin, 21 June 08:10, ");
  await expect(page.getByText("No sightings match these filters.")).toBeVisible();

  // Bulk approve a filtered set of ten: all carry a check mark, so they are left out until
  // the coordinator includes that mark explicitly; the confirmation says how many.
  await page.getByLabel("Check mark").selectOption({ label: "Poor location accuracy" });
  await expect(rows).toHaveCount(10);
  await page.getByRole("heading", { level: 1, name: "Review desk" }).click();
  await page.keyboard.press("Shift+B");
  const confirm = page.getByRole("alertdialog");
  await expect(confirm).toContainText(
    "10 pending sightings match these filters. 10 are left out for their check marks:",
  );
  await expect(confirm).toContainText("No pending sightings match these filters.");
  await expect(confirm.getByRole("button", { name: /Yes, approve/ })).toHaveCount(0);
  await confirm.getByLabel("Include those marked “Poor location accuracy”").check();
  await expect(confirm).toContainText("Approve 10 pending sightings that match these filters?");
  await confirm.getByRole("button", { name: "Yes, approve 10" }).click();
  await expect(page.getByRole("status")).toHaveText("10 sightings approved.");
  await expect(page.getByText("No sightings match these filters.")).toBeVisible();

  // What was stored: each decision in the history, the question in reviews.message.
  const db = new Client({ connectionString: E2E_DB_URL });
  await db.connect();
  try {
    const { rows: decided } = await db.query<{
      id: string;
      state: string;
      to_state: string;
      reason: string;
      message: string;
      reviewer: string;
    }>(
      `
      SELECT s.id, s.review_state AS state, r.to_state, r.reason, r.message, u.email AS reviewer
      FROM sightings s JOIN reviews r ON r.sighting_id = s.id JOIN users u ON u.id = r.reviewer_id WHERE s.id = ANY($1::uuid[])`,
      [[caseId("outside-area:1"), caseId("outside-area:2"), caseId("outside-area:3")]],
    );
    const by = Object.fromEntries(decided.map((d) => [d.id, d]));
    expect(by[caseId("outside-area:3")]).toMatchObject({
      state: "approved",
      to_state: "approved",
      reviewer: DEMO.birdsCoordinator,
    });
    expect(by[caseId("outside-area:2")]).toMatchObject({
      state: "rejected",
      reason: "outside_event",
      message: "The lane is outside the reserve boundary.",
    });
    expect(by[caseId("outside-area:1")]).toMatchObject({ state: "returned", message: question });
    const bulk = await db.query<{ n: number }>(
      `SELECT count(*)::int AS n FROM sightings WHERE id = ANY($1::uuid[]) AND review_state = 'approved'`,
      [Array.from({ length: 10 }, (_, i) => caseId(`poor-accuracy:${i + 1}`))],
    );
    expect(bulk.rows[0]!.n).toBe(10);
    const plant = await db.query<{ review_state: string }>(`SELECT review_state FROM sightings WHERE id = $1`, [
      caseId("poor-accuracy:plant"),
    ]);
    expect(plant.rows[0]!.review_state).toBe("pending");
  } finally {
    await db.end();
  }

  // The digests, one per volunteer, in each volunteer's language.
  const ten = await mail.waitFor("volunteer6@example.org", (m) => /Approved:/.test(m.text), 45_000);
  expect(ten.text.match(/^- Approved:/gm)?.length).toBe(10);
  expect(ten.subject).toBe("10 review decisions on your sightings");
  const returned = await mail.waitFor("volunteer1@example.org", (m) => m.text.includes(question), 45_000);
  expect(returned.text).toMatch(/Returned with a question: European robin \(Erithacus rubecula\)/);
  const rejected = await mail.waitFor("volunteer2@example.org", (m) => /Rejected: /.test(m.text), 45_000);
  expect(rejected.text).toMatch(
    /Rejected: Common blackbird \(Turdus merula\) ×2, .*Reason: Outside the event \(place or time\)/,
  );
  expect(rejected.text).toContain("Coordinator's note: The lane is outside the reserve boundary.");
  const approved = await mail.waitFor("volunteer3@example.org", (m) => /Aprobada/.test(m.text), 45_000); // Lucía reads Spanish
  expect(approved.text).toMatch(/Aprobada: .*Fringilla coelebs/);

  // The volunteer's field log shows the returned sighting with the coordinator's question.
  // The phone is set to another time zone: times still read in the event's (Europe/London).
  const phone = await browser.newContext({ timezoneId: "Pacific/Auckland" });
  const field = await phone.newPage();
  await signInWithPassword(field, "volunteer1@example.org");
  await field.goto("/en/field");
  const pick = field.getByRole("button", { name: /Harrowmere Vale Midsummer Count/ });
  const heading = field.getByRole("heading", { level: 2, name: "Harrowmere Vale Midsummer Count" });
  await expect(pick.or(heading)).toBeVisible({ timeout: 20_000 });
  if (await pick.isVisible()) await pick.click();
  await expect(heading).toBeVisible();
  const asked = field.getByRole("listitem").filter({ hasText: question });
  await expect(asked).toBeVisible({ timeout: 30_000 });
  await expect(asked).toContainText("Coordinator's question:");
  await expect(asked).toContainText("European robin");
  await expect(field.getByText("Times are shown in the event's time zone (Europe/London).")).toBeVisible();
  const observed = await withE2eDb((c) =>
    c.query<{ at: Date }>("SELECT observed_at AS at FROM sightings WHERE id = $1", [caseId("outside-area:1")]),
  );
  const londonTime = await field.evaluate(
    (iso) =>
      new Intl.DateTimeFormat("en", {
        hour: "2-digit",
        minute: "2-digit",
        day: "numeric",
        month: "short",
        timeZone: "Europe/London",
      }).format(new Date(iso)),
    observed.rows[0]!.at.toISOString(),
  );
  await expect(asked).toContainText(londonTime);
  await phone.close();
});
