import AxeBuilder from "@axe-core/playwright";
import type { Browser, Page } from "@playwright/test";
import ar from "../../messages/ar.json";
import en from "../../messages/en.json";
import { DESK_KEYS } from "../../lib/review/decisions";
import { demoIds, withE2eDb } from "./demo-ids";
import { DEMO, expect, publishThroughPreview, signInWithPassword, test } from "./support";

// An accessibility audit of every screen with axe-core (WCAG 2.0/2.1 A and AA rules), on a
// phone (390×844) and a desktop (1280×800), left to right (English) and right to left
// (Arabic): no violation of "serious" or "critical" impact is allowed anywhere.
const VIEWPORTS = [
  { width: 390, height: 844 },
  { width: 1280, height: 800 },
];
const LOCALES = { en, ar } as const;
type Loc = keyof typeof LOCALES;
const SLUG = "harrowmere-vale-midsummer-count";
const SETUP_SLUG = "harrowmere-vale-autumn-fungus-foray";
const FIELD_EVENT = "Kestrel Moor Winter Count";

test.describe.configure({ timeout: 240_000 });
// Inside the demo's "Heather Crest" zone on Kestrel Moor, for the field log.
test.use({ geolocation: { latitude: 53.3045, longitude: -2.095, accuracy: 8 }, permissions: ["geolocation"] });

/** The serious and critical violations on the page as it is now, described for the failure message. */
async function audit(page: Page, what: string) {
  const result = await new AxeBuilder({ page }).withTags(["wcag2a", "wcag2aa", "wcag21a", "wcag21aa"]).analyze();
  const bad = result.violations
    .filter((v) => v.impact === "serious" || v.impact === "critical")
    .map((v) => `${v.id} (${v.impact}): ${v.help} — ${v.nodes.map((n) => n.target.join(" ")).join(", ")}`);
  expect(bad, `${what}: ${bad.join("\n")}`).toEqual([]);
}

/** Runs `visit` (which brings the page to the screen) and audits it at each size, in each direction. */
async function everyWay(page: Page, name: string, visit: (loc: Loc, m: (typeof LOCALES)[Loc]) => Promise<void>) {
  for (const [loc, m] of Object.entries(LOCALES) as [Loc, (typeof LOCALES)[Loc]][]) {
    for (const size of VIEWPORTS) {
      await page.setViewportSize(size);
      await visit(loc, m);
      await expect(page.locator("html")).toHaveAttribute("dir", loc === "ar" ? "rtl" : "ltr");
      await audit(page, `${name} ${loc} ${size.width}×${size.height}`);
    }
  }
}

async function signedIn(browser: Browser, email: string) {
  const context = await browser.newContext({
    geolocation: { latitude: 53.3045, longitude: -2.095, accuracy: 8 },
    permissions: ["geolocation"],
  });
  const page = await context.newPage();
  await signInWithPassword(page, email);
  return page;
}

test("landing page", async ({ page }) => {
  await everyWay(page, "landing", async (loc, m) => {
    await page.goto(`/${loc}`);
    await expect(page.getByRole("heading", { level: 1, name: m.Home.title })).toBeVisible();
  });
});

test("public event page", async ({ page }) => {
  await everyWay(page, "event", async (loc, m) => {
    await page.goto(`/${loc}/events/${SLUG}`);
    await expect(page.getByRole("heading", { name: m.Safety.title })).toBeVisible();
  });
});

test("sign-in page", async ({ page }) => {
  await everyWay(page, "sign-in", async (loc, m) => {
    await page.goto(`/${loc}/sign-in`);
    await expect(page.getByRole("heading", { level: 1, name: m.SignIn.title })).toBeVisible();
  });
});

test("account page", async ({ browser }) => {
  const page = await signedIn(browser, DEMO.coordinator);
  await everyWay(page, "account", async (loc, m) => {
    await page.goto(`/${loc}/account`);
    await expect(page.getByRole("heading", { level: 1, name: m.Account.title })).toBeVisible();
  });
});

test("join page", async ({ page }) => {
  const { setupJoinCode } = await demoIds();
  await everyWay(page, "join", async (loc, m) => {
    await page.goto(`/${loc}/join/${setupJoinCode}`);
    await expect(page.getByRole("button", { name: m.Join.submit, exact: true })).toBeVisible();
  });
});

test("field log: session, sighting form with a sensitive species caution, outbox", async ({ browser }) => {
  const page = await signedIn(browser, DEMO.volunteer);
  await everyWay(page, "field log", async (loc, m) => {
    await page.goto(`/${loc}/field`);
    const pick = page.getByRole("button", { name: new RegExp(FIELD_EVENT) });
    const heading = page.getByRole("heading", { level: 2, name: FIELD_EVENT });
    await expect(pick.or(heading)).toBeVisible();
    if (await pick.isVisible()) await pick.click();
    await expect(page.getByRole("button", { name: m.FieldLog.addSighting })).toBeEnabled({ timeout: 20_000 });
    // The session start form with its safety line.
    await expect(page.getByRole("note").filter({ hasText: m.FieldLog.session.safetyReminder })).toBeVisible();
    await expect(page.getByRole("heading", { name: m.FieldLog.outboxTitle })).toBeVisible();
  });
  // The sighting form, in both directions and sizes.
  await everyWay(page, "field log form", async (loc, m) => {
    await page.goto(`/${loc}/field`);
    await page.getByRole("button", { name: m.FieldLog.addSighting }).click({ timeout: 20_000 });
    const form = page.getByRole("form", { name: m.FieldLog.addTitle });
    await expect(form).toBeVisible();
  });
});

async function openDesk(page: Page, loc: Loc, m: (typeof LOCALES)[Loc]) {
  await page.goto(`/${loc}/events/${SLUG}/review`);
  await expect(page.getByRole("heading", { level: 1, name: m.ReviewDesk.title })).toBeVisible();
  const rows = page
    .getByRole("table", { name: m.ReviewDesk.queue.title })
    .getByRole("row")
    .filter({ has: page.getByRole("cell") });
  await rows.first().click();
  await expect(page.getByRole("heading", { level: 3, name: m.ReviewDesk.detail.history })).toBeVisible();
}

test("review desk: queue and detail", async ({ browser }) => {
  const page = await signedIn(browser, DEMO.coordinator);
  await everyWay(page, "review desk", (loc, m) => openDesk(page, loc, m));
});

for (const action of ["reject", "return", "reidentify"] as const) {
  test(`review desk: the ${action} form`, async ({ browser }) => {
    const page = await signedIn(browser, DEMO.coordinator);
    await everyWay(page, `review desk ${action} form`, async (loc, m) => {
      await openDesk(page, loc, m);
      // Opened with the desk's own key, as a coordinator works (keys: lib/review/decisions.ts).
      await page.keyboard.press(DESK_KEYS[action === "return" ? "returnWithQuestion" : action]);
      await expect(
        page.getByRole(action === "reidentify" ? "group" : "form", { name: m.ReviewDesk.actions[action] }),
      ).toBeVisible();
    });
  });
}

test("event setup: each tab", async ({ browser }) => {
  const page = await signedIn(browser, DEMO.organiser);
  for (const part of ["", "/zones", "/species", "/people"]) {
    await everyWay(page, `setup${part || "/details"}`, async (loc, m) => {
      await page.goto(`/${loc}/events/${SETUP_SLUG}/setup${part}`);
      await expect(page.getByRole("navigation", { name: m.Setup.tabs.label })).toBeVisible();
      await expect(page.getByText(m.Setup.loading)).toHaveCount(0, { timeout: 20_000 });
    });
  }
  await everyWay(page, "setup list", async (loc, m) => {
    await page.goto(`/${loc}/setup`);
    await expect(page.getByRole("heading", { level: 1, name: m.Setup.title })).toBeVisible();
  });
});

test("live board", async ({ browser }) => {
  const page = await signedIn(browser, DEMO.coordinator);
  await everyWay(page, "live board", async (loc, m) => {
    await page.goto(`/${loc}/events/${SLUG}/live`);
    await expect(page.getByTestId("live-board")).toBeVisible({ timeout: 20_000 });
    await expect(page.getByRole("note").filter({ hasText: m.Results.live.nextAccess })).toBeVisible();
    await expect(page.getByRole("complementary", { name: m.Results.caution.title })).toBeVisible();
  });
});

test("results and the public report", async ({ browser }) => {
  const page = await signedIn(browser, DEMO.organiser);
  await everyWay(page, "results", async (loc, m) => {
    await page.goto(`/${loc}/events/${SLUG}/results`);
    await expect(page.getByRole("figure", { name: m.Results.charts.zones })).toBeVisible({ timeout: 30_000 });
  });
  // The public report: the latest published version, or a first one published through the page.
  const latest = () =>
    withE2eDb(async (db) => {
      const { rows } = await db.query<{ v: number }>(
        "SELECT coalesce(max(version), 0)::int AS v FROM reports r JOIN events e ON e.id = r.event_id WHERE e.slug = $1",
        [SLUG],
      );
      return rows[0]!.v;
    });
  // The preview of the next report, as its organiser sees it before publishing.
  await everyWay(page, "report preview", async (loc) => {
    await page.goto(`/${loc}/events/${SLUG}/reports/preview`);
    await expect(page.getByTestId("preview-banner")).toBeVisible({ timeout: 60_000 });
  });
  if ((await latest()) === 0) await publishThroughPreview(page, SLUG);
  const version = await latest();
  const visitor = await (await browser.newContext()).newPage();
  await everyWay(visitor, "public report", async (loc, m) => {
    await visitor.goto(`/${loc}/events/${SLUG}/reports/${version}`);
    await expect(visitor.getByText(m.Report.sensitive.title, { exact: true }).first()).toBeVisible();
  });
});

test("site admin console: each view, and an organisation's page", async ({ browser }) => {
  const page = await signedIn(browser, "admin@example.org");
  const views = [
    ["", "organisations"],
    ["/people", "people"],
    ["/events", "events"],
    ["/health", "health"],
    ["/audit", "audit"],
  ] as const;
  for (const [path, nav] of views) {
    await everyWay(page, `admin${path || "/organisations"}`, async (loc, m) => {
      await page.goto(`/${loc}/admin${path}`);
      await expect(page.getByRole("heading", { level: 1, name: m.Admin.nav[nav] })).toBeVisible();
      // The people view with an erasure form open (the admin's own row has none).
      if (nav === "people") await page.getByText(m.Admin.erase).first().click();
    });
  }
  const { organisationId } = await demoIds();
  const organiser = await signedIn(browser, DEMO.organiser);
  await everyWay(organiser, "organisation page", async (loc, m) => {
    await organiser.goto(`/${loc}/organisations/${organisationId}`);
    await expect(organiser.getByRole("heading", { level: 2, name: m.Organisations.eventMembersTitle })).toBeVisible();
  });
});
