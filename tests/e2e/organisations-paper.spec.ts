import { readFileSync } from "node:fs";
import { Client } from "pg";
import { E2E_DB_URL } from "./demo-ids";
import { DEMO, expect, signInWithPassword, test } from "./support";

// Issue 19: a person asks for an organisation, the site admin approves it from the console
// and the new organiser creates an event; a coordinator brings in a paper sheet (a bad line
// first: nothing saved, the line named), and the records wait on the desk marked "paper sheet".

async function query<T>(text: string, values: unknown[] = []): Promise<T[]> {
  const c = new Client({ connectionString: E2E_DB_URL });
  await c.connect();
  try {
    return (await c.query(text, values)).rows as T[];
  } finally {
    await c.end();
  }
}

const FOUNDER = "ivy.marsh@example.org";
const ORG = "Saltmarsh Moth Group";

test("a person asks for an organisation, the admin approves it, and the new organiser creates an event", async ({
  page,
  browser,
}) => {
  test.setTimeout(180_000);
  // A person with an account and no roles (as after accepting an invitation once).
  await query(
    `INSERT INTO users (email, name, password_hash, email_verified)
     SELECT $1, 'Ivy Marsh', password_hash, now() FROM users WHERE email = $2 ON CONFLICT DO NOTHING`,
    [FOUNDER, DEMO.volunteer],
  );
  await signInWithPassword(page, FOUNDER);
  await page.goto("/en/setup");
  await page.getByRole("link", { name: "Ask for a new organisation" }).click();
  await expect(page.getByRole("heading", { level: 1, name: "Ask for a new organisation" })).toBeVisible();
  const form = page.getByRole("form", { name: "Ask for a new organisation" });
  await form.getByLabel("Organisation name").fill(ORG);
  await form.getByRole("button", { name: "Send the request" }).click();
  await expect(form.getByRole("alert").filter({ hasText: "Choose a country from the list." })).toBeVisible();
  await form.getByLabel("Country").selectOption({ label: "United Kingdom" });
  await form.getByLabel("What does it do? (one sentence)").fill("Runs moth traps on the saltmarsh every summer.");
  await form.getByRole("button", { name: "Send the request" }).click();
  await expect(page.getByRole("status").filter({ hasText: "Your request has been sent." })).toBeVisible();
  await expect(page.getByText(`${ORG} (United Kingdom)`)).toContainText("waiting for the site administrator");
  // The site admin was mailed (through the outbox).
  const [adminMail] = await query<{ subject: string }>(
    "SELECT subject FROM email_outbox WHERE to_address = 'admin@example.org' AND kind = 'organisation_request' ORDER BY id DESC LIMIT 1",
  );
  expect(adminMail!.subject).toBe(`New organisation request: ${ORG}`);

  // The admin approves it from the console.
  const adminContext = await browser.newContext();
  const admin = await adminContext.newPage();
  await signInWithPassword(admin, "admin@example.org");
  await admin.goto("/en/admin");
  await expect(admin.getByRole("heading", { level: 1, name: "Organisations" })).toBeVisible();
  const request = admin.getByRole("listitem", { name: ORG });
  await expect(request).toContainText("Runs moth traps on the saltmarsh every summer.");
  await request.getByRole("button", { name: "Approve" }).click();
  await expect(request).toHaveCount(0);
  const row = admin.getByRole("table", { name: /All organisations/ }).getByRole("row", { name: new RegExp(ORG) });
  await expect(row).toContainText("active");
  await expect(row.getByRole("cell").nth(1)).toHaveText("1"); // one organiser
  // The console's audit view shows the decision.
  await admin.goto("/en/admin/audit?source=organisations");
  await expect(admin.getByRole("table", { name: "Audit log" })).toContainText("approved");
  await adminContext.close();

  // The new organiser creates the organisation's first event.
  await page.reload();
  await expect(page.getByText(`${ORG} (United Kingdom)`)).toContainText("approved");
  await page.getByRole("link", { name: "Create its events" }).click();
  await expect(page.getByRole("heading", { level: 2, name: ORG })).toBeVisible();
  const create = page.getByRole("form", { name: "New survey event" });
  await create.getByLabel("Event name").fill("Saltmarsh Moth Night");
  await create.getByLabel("Starts (event time)").fill("2027-07-10T20:00");
  await create.getByLabel("Ends (event time)").fill("2027-07-11T06:00");
  await create.getByLabel("Time zone").fill("Europe/London");
  await create.getByRole("button", { name: "Create the event" }).click();
  await expect(page).toHaveURL(/\/en\/events\/saltmarsh-moth-night\/setup$/);
  await expect(page.getByRole("heading", { level: 1, name: "Saltmarsh Moth Night" })).toBeVisible();
});

test("a coordinator uploads a paper sheet: a bad line refuses it all, the fixed sheet lands pending on the desk", async ({
  page,
}) => {
  test.setTimeout(180_000);
  const [facts] = await query<{ id: string; zone: string; taxon: string; kind: string; start: string; end: string }>(`
    SELECT e.id, (e.session_kinds)[1]::text AS kind, (SELECT name FROM zones WHERE event_id = e.id ORDER BY name LIMIT 1) AS zone,
      (SELECT t.scientific_name FROM event_species es JOIN taxa t ON t.id = es.taxon_id
        WHERE es.event_id = e.id AND t.sensitivity = 'open' ORDER BY t.scientific_name LIMIT 1) AS taxon,
      to_char((e.starts_at AT TIME ZONE e.time_zone) + interval '3 hours', 'YYYY-MM-DD HH24:MI') AS start,
      to_char((e.starts_at AT TIME ZONE e.time_zone) + interval '4 hours', 'YYYY-MM-DD HH24:MI') AS "end"
    FROM events e WHERE e.slug = 'harrowmere-vale-midsummer-count'`);
  const sheet = (badTaxon: boolean) =>
    [
      "line_type,session_ref,zone,session_kind,start,end,full_list,taxon,description,count,observed_at,notes",
      `count_session,A,${facts!.zone},${facts!.kind},${facts!.start},${facts!.end},yes,,,,,sheet 7`,
      `sighting,A,,,,,,${facts!.taxon},,3,,`,
      `sighting,A,,,,,,${badTaxon ? "Nonexistens vulgaris" : ""},${badTaxon ? "" : "pale moth at the trap"},1,,`,
    ].join("\n");
  const file = (badTaxon: boolean) => ({
    name: badTaxon ? "sheet-7.csv" : "sheet-7-fixed.csv",
    mimeType: "text/csv",
    buffer: Buffer.from(sheet(badTaxon)),
  });
  const paperCount = async () =>
    (
      await query<{ n: number }>(
        "SELECT count(*)::int AS n FROM sightings WHERE event_id = $1 AND source = 'paper_sheet'",
        [facts!.id],
      )
    )[0]!.n;

  await signInWithPassword(page, DEMO.coordinator);
  await page.goto("/en/events/harrowmere-vale-midsummer-count/review");
  await page.getByRole("link", { name: "Paper sheets" }).click();
  await expect(page.getByRole("heading", { level: 1, name: "Paper sheets" })).toBeVisible();

  // The template lists the event's zones and species list.
  const downloading = page.waitForEvent("download");
  await page.getByRole("link", { name: "Download the sheet template (CSV)" }).click();
  const template = readFileSync((await (await downloading).path())!, "utf8");
  expect(template).toContain(`#   ${facts!.zone}`);
  expect(template).toContain(`#   ${facts!.taxon}`);
  expect(template.trim().split(/\r?\n/).at(-1)).toMatch(/^line_type,session_ref,observer_email,zone,/);

  // One bad line: the report names line 4, nothing is saved.
  await page.getByLabel("Sheet file (CSV)").setInputFiles(file(true));
  const report = page.getByRole("alert").filter({ hasText: "problem found" });
  await expect(report).toContainText("1 problem found");
  await expect(report).toContainText("Nothing was saved.");
  await expect(report.getByRole("row", { name: /^4 / })).toContainText(
    "“Nonexistens vulgaris” is not on this event's species list.",
  );
  await expect(page.getByRole("button", { name: "Save the sheet" })).toHaveCount(0);
  expect(await paperCount()).toBe(0);

  // Fixed: checked, then saved.
  await page.getByLabel("Sheet file (CSV)").setInputFiles(file(false));
  await expect(
    page
      .getByRole("status")
      .filter({ hasText: "sheet-7-fixed.csv is valid: 1 count sessions (1 with a full list) and 2 sightings." }),
  ).toBeVisible();
  expect(await paperCount()).toBe(0);
  await page.getByRole("button", { name: "Save the sheet" }).click();
  await expect(page.getByRole("status").filter({ hasText: "Saved: 1 count sessions and 2 sightings" })).toBeVisible();
  expect(await paperCount()).toBe(2);

  // On the desk: pending, marked as typed in from a paper sheet by the coordinator.
  await page.getByRole("link", { name: "Open the review desk" }).click();
  await expect(page.getByRole("heading", { level: 1, name: "Review desk" })).toBeVisible();
  await page.getByLabel("Volunteer").selectOption({ label: "Tomás Ferreira" });
  const rows = page
    .getByRole("table", { name: "Queue" })
    .getByRole("row")
    .filter({ has: page.getByRole("cell") });
  await expect(rows).toHaveCount(2);
  for (let i = 0; i < 2; i++) await expect(rows.nth(i)).toContainText("Pending");
  await page.getByRole("heading", { level: 1, name: "Review desk" }).click();
  await page.keyboard.press("j");
  await expect(page.getByText("paper sheet, typed in by Tomás Ferreira")).toBeVisible();
  await expect(page.getByText(/^Full list · 2 sightings in this session$/)).toBeVisible();
});
