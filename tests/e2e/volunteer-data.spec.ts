import { readFileSync } from "node:fs";
import { strFromU8, unzipSync } from "fflate";
import type { Page } from "@playwright/test";
import { withE2eDb } from "./demo-ids";
import { DEMO, expect, publishThroughPreview, signInWithPassword, test } from "./support";

// A volunteer's own data (issue 15): the published name they chose, their download, the
// erasure of their account with the published report still valid, and a sign-out that
// leaves nothing of them on a shared phone.

const SLUG = "harrowmere-vale-midsummer-count";
const ERIN = "erin.eraser@example.org";

/** A volunteer of our own (erased below, so no other test's person), with two approved sightings. */
async function makeErin(): Promise<void> {
  await withE2eDb(async (db) => {
    await db.query(`
      WITH u AS (
        INSERT INTO users (email, name, password_hash, locale)
        SELECT '${ERIN}', 'Erin Eraser', password_hash, 'en' FROM users WHERE email = 'volunteer1@example.org'
        RETURNING id),
      e AS (SELECT id FROM events WHERE slug = '${SLUG}'),
      m AS (INSERT INTO event_members (event_id, user_id, role) SELECT e.id, u.id, 'volunteer' FROM e, u),
      src AS (
        SELECT s.* FROM sightings s, e WHERE s.event_id = e.id AND s.review_state = 'approved' AND s.taxon_id IS NOT NULL
        ORDER BY s.id LIMIT 2),
      ins AS (
        INSERT INTO sightings (id, event_id, user_id, taxon_id, count, observed_at, location, accuracy_m, zone_id, review_state)
        SELECT gen_random_uuid(), src.event_id, u.id, src.taxon_id, 4, src.observed_at, src.location, src.accuracy_m, src.zone_id, 'approved'
        FROM src, u RETURNING id, event_id)
      INSERT INTO reviews (sighting_id, event_id, reviewer_id, from_state, to_state)
      SELECT ins.id, ins.event_id, (SELECT id FROM users WHERE email = 'coordinator@example.org'), 'pending', 'approved' FROM ins`);
  });
}

const reportDigest = (version: number) =>
  withE2eDb(async (db) => {
    const { rows } = await db.query<{ h: string; id: string }>(
      "SELECT r.id, md5(r.results::text || r.input_hash || to_jsonb(i)::text) AS h FROM reports r JOIN report_inputs i ON i.report_id = r.id JOIN events e ON e.id = r.event_id WHERE e.slug = $1 AND r.version = $2",
      [SLUG, version],
    );
    return rows[0]!;
  });

async function download(page: Page, name: string): Promise<string> {
  const [file] = await Promise.all([page.waitForEvent("download"), page.getByRole("link", { name }).click()]);
  return readFileSync((await file.path())!, "utf8");
}

test("a volunteer downloads their data and deletes their account; the published report still re-computes identically", async ({
  page,
  browser,
  baseURL,
}) => {
  test.setTimeout(150_000);
  await makeErin();
  await signInWithPassword(page, ERIN);
  await page.goto("/en/account");

  // The published name, with consent.
  await expect(page.getByText("You have not chosen a published name yet")).toBeVisible();
  await page.getByLabel("Name to publish (your name or a pseudonym)").fill("erin@example.org");
  await page.getByRole("button", { name: "Save name" }).click();
  await expect(page.getByRole("alert").filter({ hasText: "Choose a name, not an e-mail address" })).toBeVisible();
  await page.getByLabel("Name to publish (your name or a pseudonym)").fill("Little Egret");
  await page.getByRole("button", { name: "Save name" }).click();
  await expect(page.getByRole("alert").filter({ hasText: "Tick the box" })).toBeVisible();
  await page.getByRole("checkbox", { name: /I agree that this name is published/ }).check();
  await page.getByRole("button", { name: "Save name" }).click();
  await expect(page.getByRole("status").filter({ hasText: "Saved." })).toBeVisible();

  // The organiser publishes a version that holds Erin's sightings; its Darwin Core names her pseudonym.
  const organiser = await browser.newContext({ baseURL });
  const org = await organiser.newPage();
  await signInWithPassword(org, DEMO.organiser);
  await publishThroughPreview(org, SLUG);
  const version = await withE2eDb(async (db) => {
    await expect
      .poll(
        async () => {
          const { rows } = await db.query<{ n: number }>(
            "SELECT count(*)::int AS n FROM reports r JOIN report_inputs i ON i.report_id = r.id JOIN events e ON e.id = r.event_id WHERE e.slug = $1 AND (SELECT s.id FROM sightings s JOIN users u ON u.id = s.user_id WHERE u.email = $2 LIMIT 1) = ANY(i.ids)",
            [SLUG, ERIN],
          );
          return rows[0]!.n;
        },
        { timeout: 30_000 },
      )
      .toBe(1);
    const { rows } = await db.query<{ v: number }>(
      "SELECT max(version)::int AS v FROM reports r JOIN events e ON e.id = r.event_id WHERE e.slug = $1",
      [SLUG],
    );
    return rows[0]!.v;
  });
  await organiser.close();
  const before = await reportDigest(version);
  const dwc = async () => {
    const res = await page.request.get(`/api/reports/${before.id}/darwin-core-archive.zip`);
    expect(res.ok()).toBe(true);
    return strFromU8(unzipSync(new Uint8Array(await res.body()))["occurrence.txt"]!);
  };
  // The recordedBy column of occurrence.txt (Darwin Core's Occurrence extension, one row per sighting).
  const recordedBy = (tsv: string) => {
    const [header, ...rows] = tsv.trimEnd().split("\n");
    const at = header!.split("\t").indexOf("recordedBy");
    expect(at).toBeGreaterThanOrEqual(0);
    return rows.map((r) => r.split("\t")[at]!);
  };
  const occurrencesBefore = await dwc();
  expect(recordedBy(occurrencesBefore)).toContain("Little Egret");
  expect(occurrencesBefore).not.toContain("@");

  // Everything the site holds about her: JSON and CSV.
  await page.reload();
  const json = JSON.parse(await download(page, "Download everything (JSON)")) as {
    account: { email: string; publishedName: string };
    sightings: { reviewState: string; decisions: { toState: string }[] }[];
  };
  expect(json.account).toMatchObject({ email: ERIN, publishedName: "Little Egret" });
  expect(json.sightings).toHaveLength(2);
  for (const s of json.sightings) {
    expect(s.reviewState).toBe("approved");
    expect(s.decisions.map((d) => d.toState)).toEqual(["approved"]);
  }
  const csv = (await download(page, "Download sightings and decisions (CSV)")).trimEnd().split("\r\n");
  expect(csv[0]).toMatch(/^sightingId,event,observedAt,scientificName/);
  expect(csv).toHaveLength(3);

  // Deleting the account: the typed address must be hers.
  await page.getByLabel(/To confirm, type your e-mail address/).fill("someone@example.org");
  await page.getByRole("button", { name: "Delete my account" }).click();
  await expect(page.getByRole("alert").filter({ hasText: "That is not your e-mail address" })).toBeVisible();
  await page.getByLabel(/To confirm, type your e-mail address/).fill(ERIN);
  await page.getByRole("button", { name: "Delete my account" }).click();
  await expect(page.getByRole("status").filter({ hasText: "Your account has been deleted." })).toBeVisible({
    timeout: 20_000,
  });
  await page.goto("/en/account");
  await expect(page).toHaveURL(/\/en\/sign-in/);
  expect(await withE2eDb(async (db) => (await db.query("SELECT 1 FROM users WHERE email = $1", [ERIN])).rowCount)).toBe(
    0,
  );

  // The published report: unchanged, and re-computed from its recorded inputs to the same numbers.
  expect(await reportDigest(version)).toEqual(before);
  const anon = await browser.newPage();
  await anon.goto(`/en/events/${SLUG}/reports/${version}?check=1`);
  await expect(anon.getByTestId("recompute")).toContainText("✓ Re-computed from its recorded inputs", {
    timeout: 20_000,
  });
  await anon.close();
  const occurrencesAfter = await dwc();
  expect(occurrencesAfter).not.toContain("Little Egret");
  expect(occurrencesAfter.split("\n").length).toBe(occurrencesBefore.split("\n").length);
  // Her rows now carry an anonymous recorder id where her pseudonym stood.
  const namesBefore = recordedBy(occurrencesBefore);
  const namesAfter = recordedBy(occurrencesAfter);
  for (const [i, name] of namesBefore.entries())
    if (name === "Little Egret") expect(namesAfter[i]).toMatch(/^recorder-[0-9a-f]{8}$/);
});

test("signing out asks about records still waiting, then leaves the phone's store empty", async ({ page }) => {
  test.setTimeout(90_000);
  await signInWithPassword(page, "volunteer2@example.org");
  await page.goto("/en/field");
  await expect(page.getByRole("heading", { level: 1 })).toBeVisible();
  // The field log has made its store; a sighting and its photo wait there, not yet sent.
  await page.goto("/en/account");
  await page.evaluate(
    () =>
      new Promise<void>((resolve, reject) => {
        const open = indexedDB.open("ecotone-field");
        open.onerror = () => reject(open.error);
        open.onsuccess = () => {
          const db = open.result;
          const tx = db.transaction(["sightings", "photos"], "readwrite");
          tx.objectStore("sightings").put({
            id: "e2e-waiting-sighting",
            eventId: "e2e",
            state: "waiting",
            nextTryAt: 0,
          });
          tx.objectStore("photos").put({
            id: "e2e-waiting-photo",
            eventId: "e2e",
            sightingId: "e2e-waiting-sighting",
            state: "waiting",
            blob: new Blob(["not really a photo"], { type: "image/jpeg" }),
          });
          tx.oncomplete = () => {
            db.close();
            resolve();
          };
          tx.onerror = () => reject(tx.error);
        };
      }),
  );
  await page.getByRole("button", { name: "Sign out" }).click();
  const dialog = page.getByRole("dialog", { name: "Sign out" });
  await expect(dialog).toContainText("2 records are still waiting on this phone and not sent yet.");
  await dialog.getByRole("button", { name: "Stay signed in" }).click();
  await expect(dialog).toBeHidden();
  await page.getByRole("button", { name: "Sign out" }).click();
  await dialog.getByRole("button", { name: "Delete them and sign out" }).click();
  await expect(page.getByRole("link", { name: "Sign in" }).first()).toBeVisible({ timeout: 20_000 });

  const counts = await page.evaluate(
    () =>
      new Promise<Record<string, number>>((resolve, reject) => {
        const open = indexedDB.open("ecotone-field");
        open.onerror = () => reject(open.error);
        open.onsuccess = () => {
          const db = open.result;
          const names = [...db.objectStoreNames];
          const tx = db.transaction(names, "readonly");
          const out: Record<string, number> = {};
          for (const n of names) {
            const req = tx.objectStore(n).count();
            req.onsuccess = () => (out[n] = req.result);
          }
          tx.oncomplete = () => {
            db.close();
            resolve(out);
          };
        };
      }),
  );
  expect(Object.keys(counts).sort()).toEqual(["meta", "mine", "packs", "photos", "sessions", "sightings"]);
  expect(Object.values(counts).every((n) => n === 0)).toBe(true);
});
