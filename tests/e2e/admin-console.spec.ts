import AxeBuilder from "@axe-core/playwright";
import type { Page } from "@playwright/test";
import { withE2eDb } from "./demo-ids";
import { DEMO, expect, signInWithPassword, test } from "./support";

// Issue 19, the rest of the site admin console: erasing an account (by the same rule as a
// person's own erasure), the map tiles among the services, the photo storage each
// organisation uses; and an organiser seeing every event's members.

const ERASED = "reed.bunting@example.org";
const SLUG = "harrowmere-vale-midsummer-count";

/** No serious or critical axe violation (WCAG 2.0/2.1 A and AA), as in accessibility.spec.ts. */
async function audit(page: Page, what: string) {
  const result = await new AxeBuilder({ page }).withTags(["wcag2a", "wcag2aa", "wcag21a", "wcag21aa"]).analyze();
  const bad = result.violations
    .filter((v) => v.impact === "serious" || v.impact === "critical")
    .map((v) => `${v.id} (${v.impact}): ${v.help} — ${v.nodes.map((n) => n.target.join(" ")).join(", ")}`);
  expect(bad, `${what}: ${bad.join("\n")}`).toEqual([]);
}

test("the site admin erases an account from the console: its sessions end, the log names no address", async ({
  page,
  browser,
}) => {
  test.setTimeout(120_000);
  // A person with an account (the demo's records and roles are left alone: other specs count them;
  // what stays of an erased person's records, tests/integration/admin-console.test.ts), signed in on their phone.
  await withE2eDb((c) =>
    c.query(
      `INSERT INTO users (email, name, password_hash, email_verified)
       SELECT $1, 'Rowan Bunting', password_hash, now() FROM users WHERE email = $2 ON CONFLICT DO NOTHING`,
      [ERASED, DEMO.volunteer],
    ),
  );
  const theirs = await browser.newContext();
  const them = await theirs.newPage();
  await signInWithPassword(them, ERASED);

  await signInWithPassword(page, "admin@example.org");
  await page.goto(`/en/admin/people?q=${encodeURIComponent(ERASED)}`);
  const row = page.getByRole("row", { name: new RegExp(ERASED) });
  await expect(row).toContainText("active");
  await row.getByText("Erase the account…").click();
  const form = row.getByRole("form", { name: `Erase the account of ${ERASED}` });
  await audit(page, "people, erasure form open");
  // A wrong address erases nothing.
  await form.getByLabel(`Type ${ERASED} to confirm`).fill("someone.else@example.org");
  await form.getByLabel("Reason for erasing").fill("Asked by letter");
  await form.getByRole("button", { name: "Erase for good" }).click();
  await expect(form.getByRole("alert")).toHaveText(/That is not this person's address/);
  await form.getByLabel(`Type ${ERASED} to confirm`).fill(ERASED);
  await form.getByRole("button", { name: "Erase for good" }).click();
  // The address is gone: the search finds nobody by it.
  await expect(page.getByText("Nobody matches.")).toBeVisible();

  const after = await withE2eDb(async (c) => {
    const { rows } = await c.query<{ email: string; published_name: string; erased_at: Date | null }>(
      `SELECT u.email, u.published_name, u.erased_at FROM users u
       WHERE u.id = (SELECT subject_user_id FROM admin_log WHERE action = 'account_erased' ORDER BY id DESC LIMIT 1)`,
    );
    return rows[0]!;
  });
  expect(after.email).toMatch(/^erased-[0-9a-f]{12}@erased\.invalid$/);
  expect(after.published_name).toMatch(/^recorder-[0-9a-f]{8}$/);
  expect(after.erased_at).not.toBeNull();

  // The tombstone is listed as erased, with nothing left to do to it.
  await page.goto(`/en/admin/people?q=${encodeURIComponent(after.email)}`);
  const tomb = page.getByRole("row", { name: new RegExp(after.email) });
  await expect(tomb.getByRole("cell").nth(1)).toHaveText("erased");
  await expect(tomb.getByRole("button")).toHaveCount(0);
  // The audit view: the erasure under the tombstone address, with the reason.
  await page.goto(`/en/admin/audit?source=admin`);
  const log = page.getByRole("table", { name: "Audit log" });
  await expect(log.getByRole("row", { name: /erased the account/ }).first()).toContainText(after.email);
  await expect(log).toContainText("Asked by letter");
  await expect(log).not.toContainText(ERASED);

  // Their own session ended with it.
  await them.goto("/en/account");
  await expect(them).toHaveURL(/\/en\/sign-in/);
  await theirs.close();
});

test("the health view checks the map tiles and shows the photo storage each organisation uses", async ({ page }) => {
  const { org, bytes, photos } = await withE2eDb(async (c) => {
    const { rows } = await c.query<{ org: string; bytes: string; photos: number }>(
      `
      SELECT o.name AS org, coalesce(sum(p.size_bytes), 0)::bigint AS bytes, count(p.id)::int AS photos
      FROM organisations o JOIN events e ON e.organisation_id = o.id
        LEFT JOIN sightings s ON s.event_id = e.id LEFT JOIN photos p ON p.sighting_id = s.id
      WHERE e.slug = $1 GROUP BY o.name`,
      [SLUG],
    );
    return { org: rows[0]!.org, bytes: Number(rows[0]!.bytes), photos: rows[0]!.photos };
  });
  await signInWithPassword(page, "admin@example.org");
  await page.goto("/en/admin/health");
  const services = page.getByRole("region", { name: "Services" });
  await expect(services).toContainText(/Map tiles\s*✓ reachable \(http:\/\/127\.0\.0\.1:\d+\)/);
  await expect(services).toContainText(/Photo storage \(S3\)\s*✓ reachable/);
  const [unit, div] = bytes >= 1e9 ? ["gigabyte", 1e9] : bytes >= 1e6 ? ["megabyte", 1e6] : ["kilobyte", 1e3];
  const size = new Intl.NumberFormat("en", { style: "unit", unit, unitDisplay: "short", maximumFractionDigits: 1 });
  const row = page.getByRole("table", { name: "Photo storage by organisation" }).getByRole("row", { name: org });
  await expect(row.getByRole("cell")).toHaveText([String(photos), size.format(bytes / div)]);
  await audit(page, "health");
});

test("an organiser sees every event of the organisation with its members", async ({ page }) => {
  await signInWithPassword(page, DEMO.organiser);
  await page.goto("/en/setup");
  await page.getByRole("link", { name: "Organisers" }).first().click();
  const events = page.getByRole("region", { name: "Events and their people" });
  const midsummer = events.getByRole("region", { name: "Harrowmere Vale Midsummer Count" });
  await expect(midsummer.getByRole("listitem").filter({ hasText: "coordinator@example.org" })).toHaveText(
    "Tomás Ferreira <coordinator@example.org>: coordinator",
  );
  await expect(midsummer.getByRole("listitem").filter({ hasText: "birds@example.org" })).toHaveText(
    "Hélène Marchand <birds@example.org>: coordinator (Birds)",
  );
  await expect(midsummer.getByRole("heading", { level: 3 })).toContainText(/\d+ members/);
  await expect(events.getByRole("region", { name: "Harrowmere Vale Autumn Fungus Foray" })).toBeVisible();
  await audit(page, "organisation page");
});
