import { Client } from "pg";
import { MailCatcher } from "../support/mail-catcher";
import { E2E_DB_URL } from "./demo-ids";
import { DEMO, expect, signInWithPassword, test } from "./support";

const EVENT = "Larkspur Common Bioblitz";
const fixture = (name: string) => `tests/fixtures/setup/${name}`;

async function joinCodeBySlug(slug: string): Promise<string> {
  const c = new Client({ connectionString: E2E_DB_URL });
  await c.connect();
  try {
    const { rows } = await c.query<{ join_code: string }>("SELECT join_code FROM events WHERE slug = $1", [slug]);
    return rows[0]!.join_code;
  } finally {
    await c.end();
  }
}

async function eventIdBySlug(slug: string): Promise<string> {
  const c = new Client({ connectionString: E2E_DB_URL });
  await c.connect();
  try {
    return (await c.query("SELECT id FROM events WHERE slug = $1", [slug])).rows[0].id;
  } finally {
    await c.end();
  }
}

test("an organiser creates an event, uploads zones and species, invites a coordinator who signs in by the mailed link", async ({
  page,
  browser,
  mail,
  baseURL,
}) => {
  test.setTimeout(240_000);
  await signInWithPassword(page, DEMO.organiser);
  await page.getByRole("link", { name: "Event setup" }).click();
  await expect(page.getByRole("heading", { level: 1, name: "Event setup" })).toBeVisible();

  // Create the event.
  const create = page.getByRole("form", { name: "New survey event" });
  await create.getByLabel("Event name").fill(EVENT);
  await create.getByLabel("Starts (event time)").fill("2027-05-15T08:00");
  await create.getByLabel("Ends (event time)").fill("2027-05-14T18:00");
  await create.getByLabel("Time zone").fill("Europe/London");
  await create.getByRole("button", { name: "Create the event" }).click();
  await expect(create.getByRole("alert").filter({ hasText: "The end must come after the start." })).toBeVisible();
  await create.getByLabel("Ends (event time)").fill("2027-05-16T18:00");
  await create.getByRole("button", { name: "Create the event" }).click();
  await expect(page).toHaveURL(/\/en\/events\/larkspur-common-bioblitz\/setup$/);
  await expect(page.getByRole("heading", { level: 1, name: EVENT })).toBeVisible();
  await expect(page.getByLabel("Web address")).toHaveCount(0);
  await expect(page.getByText("Web address: /events/larkspur-common-bioblitz")).toBeVisible();
  await expect(page.getByLabel("Starts (event time)")).toHaveValue("2027-05-15T08:00");

  // Area and zones: a bad file gets the report and changes nothing; the good one is saved.
  await page.getByRole("link", { name: "Area and zones" }).click();
  await expect(page.getByText("No area or zones yet.")).toBeVisible();
  await page.getByLabel("GeoJSON file").setInputFiles(fixture("zones-bad.geojson"));
  const geoReport = page.getByRole("alert").filter({ hasText: /problems? found/ });
  // Every problem of the file at once: the bow tie and the zone running past the area's edge.
  await expect(geoReport).toContainText("2 problems found");
  await expect(geoReport.getByRole("row", { name: /Dew Pond/ })).toContainText(
    "The shape is not valid: Self-intersection",
  );
  await expect(geoReport.getByRole("row", { name: /Oak Copse/ })).toContainText(
    "The zone is not inside the event area",
  );
  await expect(geoReport).toContainText("Nothing was saved.");
  await expect(page.getByRole("button", { name: "Save area and zones" })).toHaveCount(0);
  await page.getByLabel("GeoJSON file").setInputFiles(fixture("zones.geojson"));
  await expect(
    page.getByRole("status").filter({ hasText: "zones.geojson is valid: 3 zones (3 new, 0 updated, 0 removed)" }),
  ).toBeVisible();
  await expect(page.getByRole("img", { name: "Preview of zones.geojson" })).toBeVisible();
  await expect(page.getByText("No area or zones yet.")).toBeVisible(); // checked, not yet saved
  await page.getByRole("button", { name: "Save area and zones" }).click();
  await expect(page.getByRole("status").filter({ hasText: "Saved: 3 zones" })).toBeVisible();
  await expect(page.getByRole("img", { name: "Map of the current area and zones" })).toBeVisible();
  const zoneTable = page.getByRole("table", { name: "Current area and zones" });
  for (const [zone, habitat] of [
    ["Dew Pond", "Wetland"],
    ["Gorse Bank", "Edge"],
    ["Oak Copse", "Woodland"],
  ]) {
    await expect(zoneTable.getByRole("row", { name: new RegExp(zone!) })).toContainText(habitat!);
  }

  // Species list: three bad lines are named, nothing is saved; then the good file.
  await page.getByRole("link", { name: "Species list" }).click();
  await page.getByLabel("CSV file").setInputFiles(fixture("species-bad.csv"));
  const csvReport = page.getByRole("alert").filter({ hasText: "problems found" });
  await expect(csvReport).toContainText("3 problems found");
  await expect(csvReport.getByRole("row")).toHaveCount(4); // the header and the three bad lines
  for (const [i, line] of [
    [1, "3"],
    [2, "5"],
    [3, "7"],
  ] as const) {
    await expect(csvReport.getByRole("row").nth(i).getByRole("cell").first()).toHaveText(line);
  }
  await expect(csvReport.getByRole("row").nth(1)).toContainText("Unknown taxon group “mushrooms”");
  await expect(csvReport.getByRole("row").nth(2)).toContainText("“rank” is empty.");
  await expect(csvReport.getByRole("row").nth(3)).toContainText("“Amanita muscaria” is already on line 2.");
  await expect(page.getByText("The list is empty.")).toBeVisible();
  await page.getByLabel("CSV file").setInputFiles(fixture("species.csv"));
  const ok = page.getByRole("status").filter({ hasText: "species.csv is valid" });
  await expect(ok).toContainText("6 taxa, 6 to add to the list (3 new to the site)");
  // Amanita muscaria is shared with the demo event: its Spanish name is kept.
  await expect(ok).toContainText(
    "Line 2: The es name stays “Falsa oronja” (other events show it too); “Matamoscas” was not applied.",
  );
  await page.getByRole("button", { name: "Save the species list" }).click();
  await expect(page.getByRole("heading", { name: "Species list (6)" })).toBeVisible();
  await expect(page.getByRole("row", { name: /Hericium erinaceus/ })).toContainText("restricted");

  // People: invite a coordinator limited to fungi.
  await page.getByRole("link", { name: "People" }).click();
  const invite = page.getByRole("form", { name: "Invite someone" });
  await invite.getByLabel("E-mail address").fill("fungi-expert@example.org");
  await invite.getByLabel("Role", { exact: true }).selectOption("coordinator");
  await invite.getByLabel("Fungi").check();
  await invite.getByRole("button", { name: "Send the invitation" }).click();
  await expect(invite.getByRole("status")).toHaveText("✓ Invitation sent to fungi-expert@example.org.");
  await expect(page.getByText("fungi-expert@example.org, as coordinator (limited to Fungi)")).toBeVisible();
  await expect(
    page.getByText("fungi-expert@example.org invited as coordinator by organiser@example.org"),
  ).toBeVisible();

  // The coordinator follows the link in the captured mail and arrives signed in, with the role.
  const message = await mail.waitFor("fungi-expert@example.org", (m) => m.subject === `Invitation: ${EVENT}`);
  expect(message.text).toContain("Maren Oakley invites you to Larkspur Common Bioblitz as coordinator");
  const coordinator = await browser.newContext({ baseURL });
  const cPage = await coordinator.newPage();
  await cPage.goto(MailCatcher.linkIn(message));
  await cPage.getByRole("main").getByRole("button", { name: "Sign in" }).click(); // the link opens a confirm page (mail scanners)
  await expect(cPage).toHaveURL(/\/en\/account$/);
  await expect(cPage.getByText("Signed in as fungi-expert@example.org")).toBeVisible();
  await expect(cPage.getByRole("link", { name: `coordinator in ${EVENT}` })).toBeVisible();
  await expect(cPage.getByText("limited to: Fungi")).toBeVisible();
  // A coordinator reviews; setting up stays with the organisers.
  await cPage.goto(new URL(page.url()).pathname.replace(/\/setup(\/.*)?$/, "/setup/species"));
  await expect(cPage.getByRole("heading", { name: "Not allowed" })).toBeVisible();
  await coordinator.close();

  await page.reload();
  await expect(page.getByLabel("Role of fungi-expert@example.org", { exact: true })).toHaveValue("coordinator");
  await expect(page.getByText("fungi-expert@example.org joined as coordinator")).toBeVisible();

  // Every change of role, and the removal, is logged.
  const member = page.getByRole("form", { name: "Change the role of fungi-expert@example.org" });
  await member.getByLabel("Role of fungi-expert@example.org", { exact: true }).selectOption("volunteer");
  await member.getByRole("button", { name: "Save role" }).click();
  await expect(
    page.getByText("fungi-expert@example.org: coordinator → volunteer, by organiser@example.org"),
  ).toBeVisible();
  await page.getByRole("button", { name: "Remove fungi-expert@example.org" }).click();
  await page.getByRole("button", { name: "Yes, remove fungi-expert@example.org" }).click();
  await expect(page.getByText("fungi-expert@example.org (volunteer) removed by organiser@example.org")).toBeVisible();
  await expect(page.getByLabel("Role of fungi-expert@example.org", { exact: true })).toHaveCount(0);
});

test("a volunteer joins with the event's join link and the mailed sign-in link", async ({
  page,
  browser,
  mail,
  baseURL,
}) => {
  test.setTimeout(150_000); // two browser contexts and a mail round trip, on a busy two-core machine
  await signInWithPassword(page, DEMO.organiser);
  await page.goto("/en/events/harrowmere-vale-autumn-fungus-foray/setup/people");
  const link = await page.getByRole("definition").filter({ hasText: "/join/" }).textContent();
  // The seeded code is HARROW-AUTUMN; the role-matrix and fuzz tests may have replaced it since.
  expect(link).toMatch(new RegExp(`/en/join/${await joinCodeBySlug("harrowmere-vale-autumn-fungus-foray")}$`));

  const visitor = await browser.newContext({ baseURL });
  const v = await visitor.newPage();
  await v.goto(link!);
  await expect(v.getByRole("heading", { level: 1, name: "Join Harrowmere Vale Autumn Fungus Foray" })).toBeVisible();
  // What is joined comes before the address: description, dates, place, and that it has not opened yet.
  const about = v.getByTestId("join-event");
  await expect(about).toContainText("A weekend looking for fungi");
  await expect(about).toContainText(/Saturday, (16 October|October 16), 2027/);
  await expect(about).toContainText("Europe/London time");
  await expect(about).toContainText("Recording has not opened yet");
  await expect(v.getByRole("region", { name: "Before you go out" })).toBeVisible();
  await v.getByLabel("E-mail address").fill("not an address");
  await v.getByRole("button", { name: "Join" }).click();
  await expect(
    v.getByRole("alert").filter({ hasText: "Enter an e-mail address such as name@example.org." }),
  ).toBeVisible();
  await v.getByLabel("E-mail address").fill("walker@example.org");
  await v.getByLabel("Name to publish (your name or a pseudonym)").fill("Heath Walker");
  await v.getByRole("checkbox", { name: /I agree that this name is published/ }).check();
  await v.getByRole("button", { name: "Join" }).click();
  await expect(v.getByRole("status")).toContainText("Check your e-mail");
  const message = await mail.waitFor(
    "walker@example.org",
    (m) => m.subject === "Confirm that you join Harrowmere Vale Autumn Fungus Foray",
  );
  await v.goto(MailCatcher.linkIn(message));
  await v.getByRole("main").getByRole("button", { name: "Sign in" }).click(); // the link opens a confirm page (mail scanners)
  await expect(v.getByRole("link", { name: "volunteer in Harrowmere Vale Autumn Fungus Foray" })).toBeVisible();
  await expect(v.getByText("Your approved sightings are published as “Heath Walker”")).toBeVisible(); // consented at joining
  await visitor.close();

  await page.reload();
  await expect(page.getByText("walker@example.org joined as volunteer")).toBeVisible();
});

test("a volunteer cannot reach event setup, by page or by handler", async ({ page }) => {
  test.setTimeout(120_000);
  await signInWithPassword(page, "volunteer2@example.org");
  await expect(page.getByRole("link", { name: "Event setup" })).toHaveCount(0);
  const eventId = await eventIdBySlug("harrowmere-vale-autumn-fungus-foray");
  await page.goto("/en/setup");
  await expect(page.getByRole("heading", { name: "Not allowed" })).toBeVisible();
  for (const part of ["", "/zones", "/species", "/people"]) {
    await page.goto(`/en/events/harrowmere-vale-autumn-fungus-foray/setup${part}`);
    await expect(page.getByRole("heading", { name: "Not allowed" })).toBeVisible();
    await expect(page.getByRole("button", { name: /Save/ })).toHaveCount(0);
  }
  const res = await page.request.get(`/api/events/${eventId}/setup/members`);
  expect(res.status()).toBe(403);
  expect((await res.json()).error.message).toBe("Your role in this event does not allow this.");
});

test("a coordinator or organiser of one event cannot touch another event's setup", async ({ browser, baseURL }) => {
  test.setTimeout(120_000);
  const moor = await eventIdBySlug("kestrel-moor-winter-count");
  const body = {
    name: "Taken over",
    description: "",
    startsLocal: "2026-11-28T08:00",
    endsLocal: "2026-12-13T17:00",
    timeZone: "Europe/London",
    languages: ["en"],
    sessionKinds: ["walk"],
    photoRequiredSensitive: true,
    photoRequiredOffList: true,
    accuracyLimitM: 100,
    status: "open",
  };
  for (const who of [DEMO.coordinator, DEMO.organiser]) {
    const context = await browser.newContext({ baseURL });
    const page = await context.newPage();
    await signInWithPassword(page, who);
    for (const [method, path, data] of [
      ["PATCH", `/api/events/${moor}/setup`, body],
      [
        "POST",
        `/api/events/${moor}/setup/members`,
        { email: "x@example.org", name: "", role: "organiser", taxonGroups: [], locale: "en" },
      ],
      ["GET", `/api/events/${moor}/setup/zones`, undefined],
    ] as const) {
      const res = await page.request.fetch(path, { method, data, headers: { origin: baseURL! } });
      expect([403, 404], `${method} ${path} as ${who}`).toContain(res.status());
    }
    await page.goto("/en/events/kestrel-moor-winter-count/setup");
    await expect(page.getByRole("heading", { name: "Not allowed" })).toBeVisible();
    await context.close();
  }
  const c = new Client({ connectionString: E2E_DB_URL });
  await c.connect();
  expect((await c.query("SELECT name FROM events WHERE id = $1", [moor])).rows[0].name).toBe(
    "Kestrel Moor Winter Count",
  );
  await c.end();
});
