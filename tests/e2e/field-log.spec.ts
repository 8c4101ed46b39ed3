import path from "node:path";
import { chromium, type Page } from "@playwright/test";
import { DEMO, expect, signInWithPassword, test } from "./support";
import { withE2eDb } from "./demo-ids";

// The field log's whole offline day (issue 5): Chromium with the network cut by the
// browser context, the real service worker, IndexedDB, the real sync handler and database.

const EVENT = "Kestrel Moor Winter Count";
// A whole day in one test, on a two-core machine shared with the server: give it room.
test.describe.configure({ timeout: 240_000 });
// Inside the demo's "Heather Crest" zone on Kestrel Moor.
test.use({ geolocation: { latitude: 53.3045, longitude: -2.095, accuracy: 8 }, permissions: ["geolocation"] });

async function openFieldLog(page: Page) {
  await page.goto("/en/field");
  const pick = page.getByRole("button", { name: new RegExp(EVENT) });
  const heading = page.getByRole("heading", { level: 2, name: EVENT });
  await expect(pick.or(heading)).toBeVisible();
  if (await pick.isVisible()) await pick.click();
  await expect(heading).toBeVisible();
  await expect(page.getByRole("button", { name: "Add sighting" })).toBeEnabled({ timeout: 20_000 });
  // The service worker controls the page and has kept the field log page for offline use.
  await page.waitForFunction(() => navigator.serviceWorker.controller !== null, undefined, { timeout: 20_000 });
  await page.waitForFunction(
    async () => Boolean(await (await caches.open("ecotone-field-pages")).match("/en/field")),
    undefined,
    { timeout: 20_000 },
  );
}

async function addSighting(
  page: Page,
  query: string,
  pick: RegExp,
  opts: { count?: number; about?: boolean; photo?: string; notes?: string } = {},
) {
  await page.getByRole("button", { name: "Add sighting" }).click();
  const form = page.getByRole("form", { name: "New sighting" });
  await form.getByRole("searchbox", { name: "Species" }).fill(query);
  await form.getByRole("list", { name: "Matching species" }).getByRole("button", { name: pick }).first().click();
  for (let i = 1; i < (opts.count ?? 1); i++) await form.getByRole("button", { name: "One more" }).click();
  if (opts.about) await form.getByLabel("About (an estimate)").check();
  await expect(form.getByText(/From the phone: 53\.30450, -2\.09500 \(± 8 m\)/)).toBeVisible();
  await expect(form.getByLabel("Zone")).toHaveValue("");
  await expect(form.getByRole("option", { name: "Heather Crest (from your position)" })).toHaveCount(1);
  if (opts.photo) {
    await form.getByLabel("Photos").setInputFiles(opts.photo);
    await expect(form.getByRole("img", { name: "Photo 1 of this sighting" })).toBeVisible();
  }
  if (opts.notes) await form.getByLabel("Notes").fill(opts.notes);
  await form.getByRole("button", { name: "Save sighting" }).click();
  await expect(form).toBeHidden();
}

test("a volunteer's offline session and five sightings survive a reload, are sent once online, and are never stored twice", async ({
  page,
  context,
}) => {
  await signInWithPassword(page, DEMO.volunteer);
  const eventId = await withE2eDb(
    async (c) => (await c.query(`SELECT id FROM events WHERE slug = 'kestrel-moor-winter-count'`)).rows[0].id as string,
  );
  const before = await withE2eDb(
    async (c) =>
      (
        await c.query(
          `SELECT count(*)::int AS n FROM sightings s JOIN users u ON u.id = s.user_id WHERE u.email = $1 AND s.event_id = $2`,
          [DEMO.volunteer, eventId],
        )
      ).rows[0].n as number,
  );
  // Other specs may have recorded sessions for this volunteer at this event already.
  const sessionsBefore = await withE2eDb(
    async (c) =>
      (
        await c.query(
          `SELECT count(*)::int AS n FROM count_sessions s JOIN users u ON u.id = s.user_id WHERE u.email = $1 AND s.event_id = $2`,
          [DEMO.volunteer, eventId],
        )
      ).rows[0].n as number,
  );

  await openFieldLog(page);
  await expect(page.getByRole("region", { name: "Before you go out" })).toContainText("ticks");

  await context.setOffline(true);
  await expect(page.getByText("No connection — records stay safe on this phone")).toBeVisible();

  await page.getByRole("radio", { name: "Transect walk" }).check();
  await page.getByRole("button", { name: "Start session" }).click();
  await expect(page.getByRole("heading", { name: "Transect walk running" })).toBeVisible();

  await addSighting(page, "kestrle", /Common kestrel/, {
    photo: path.join(__dirname, "../fixtures/field/moor-sighting.jpg"),
    notes: "Hovering over the ridge",
  });
  await addSighting(page, "robin", /European robin/, { count: 2 });
  await addSighting(page, "Turdus merula", /Common blackbird/, { count: 3 });
  await addSighting(page, "chaffinch", /Common chaffinch/, { count: 12, about: true });
  await addSighting(page, "wren", /Eurasian wren/);
  await expect(page.getByText("Heather Crest · 0 minutes · 5 sightings")).toBeVisible();

  await page.getByRole("button", { name: "End session" }).click();
  const end = page.getByRole("form", { name: "End the count session" });
  await end.getByRole("radio", { name: "Yes, the list is full" }).check();
  await end.getByLabel("Distance walked (metres)").fill("850");
  await end.getByRole("button", { name: "End session" }).click();

  // Still offline: the page comes back from the service worker with every record waiting.
  await page.reload();
  const outbox = page.getByRole("list", { name: "On this phone" });
  await expect(outbox.getByRole("listitem")).toHaveCount(6, { timeout: 15_000 }); // the session and 5 sightings; the photo waits with its sighting
  await expect(outbox.getByRole("listitem").filter({ hasText: "Waiting" })).toHaveCount(6);
  for (const name of ["Common kestrel", "European robin", "Common blackbird", "Common chaffinch", "Eurasian wren"]) {
    await expect(outbox.getByRole("listitem").filter({ hasText: name })).toContainText("Waiting");
  }
  await expect(outbox.getByRole("listitem").filter({ hasText: "Common chaffinch" })).toContainText("about 12");
  await expect(page.getByText("6 records still on this phone")).toBeVisible();

  await context.setOffline(false);
  // "Sent" lists the volunteer's records at this event the server holds: any from before, and the five.
  await expect(page.getByRole("list", { name: "Sent" }).getByRole("listitem")).toHaveCount(before + 5, {
    timeout: 60_000,
  });
  // The photo follows its sighting (the server checks its bytes and makes a thumbnail).
  await expect(page.getByText("Everything is sent.")).toBeVisible({ timeout: 90_000 });
  await expect(page.getByRole("list", { name: "On this phone" })).toHaveCount(0);
  await expect(page.getByRole("list", { name: "Sent" }).getByRole("listitem").first()).toContainText("Pending");

  const ids = await page.evaluate(async () => {
    const open = indexedDB.open("ecotone-field");
    const idb: IDBDatabase = await new Promise((res, rej) => {
      open.onsuccess = () => res(open.result);
      open.onerror = () => rej(open.error);
    });
    const all = (store: string) =>
      new Promise<{ id: string; record: unknown; state: string }[]>((res) => {
        const r = idb.transaction(store).objectStore(store).getAll();
        r.onsuccess = () => res(r.result);
      });
    return { sessions: await all("sessions"), sightings: await all("sightings"), photos: await all("photos") };
  });
  const sessionId = ids.sessions[0]!.id;
  // This session's sightings (the phone also keeps the volunteer's earlier records it learnt of from the server).
  const thisSession = ids.sightings.filter((s) => (s.record as { sessionId?: string | null }).sessionId === sessionId);
  const sightingIds = thisSession.map((s) => s.id).sort();

  const stored = await withE2eDb(async (c) => ({
    sessions: (
      await c.query(
        `SELECT id, kind, all_species_noted, distance_m, ended_at IS NOT NULL AS ended, zone_id IS NOT NULL AS zoned FROM count_sessions WHERE id = $1`,
        [sessionId],
      )
    ).rows,
    sightings: (
      await c.query(`SELECT id::text FROM sightings WHERE session_id = $1 ORDER BY id`, [sessionId])
    ).rows.map((r) => r.id as string),
    total: (
      await c.query(
        `SELECT count(*)::int AS n FROM sightings s JOIN users u ON u.id = s.user_id WHERE u.email = $1 AND s.event_id = $2`,
        [DEMO.volunteer, eventId],
      )
    ).rows[0].n as number,
    chaffinch: (
      await c.query(
        `SELECT s.count, s.count_is_estimate, z.name AS zone FROM sightings s JOIN taxa t ON t.id = s.taxon_id LEFT JOIN zones z ON z.id = s.zone_id WHERE s.session_id = $1 AND t.scientific_name = 'Fringilla coelebs'`,
        [sessionId],
      )
    ).rows[0],
  }));
  expect(stored.sessions).toEqual([
    { id: sessionId, kind: "walk", all_species_noted: true, distance_m: 850, ended: true, zoned: true },
  ]);
  expect(stored.sightings).toEqual(sightingIds);
  expect(stored.sightings).toHaveLength(5);
  expect(stored.total).toBe(before + 5);
  expect(stored.chaffinch).toEqual({ count: 12, count_is_estimate: true, zone: "Heather Crest" });

  // The photo went after its sighting, straight to the photo store (the S3 fake).
  expect(ids.photos).toHaveLength(1);
  const photoId = ids.photos[0]!.id;
  expect(ids.photos[0]!.state).toBe("sent");
  const photoRows = await withE2eDb(
    async (c) =>
      (
        await c.query(
          `SELECT p.id::text, p.content_type, t.scientific_name FROM photos p JOIN sightings s ON s.id = p.sighting_id JOIN taxa t ON t.id = s.taxon_id WHERE s.session_id = $1`,
          [sessionId],
        )
      ).rows,
  );
  expect(photoRows).toEqual([{ id: photoId, content_type: "image/jpeg", scientific_name: "Falco tinnunculus" }]);
  const link = await page.request.get(`/api/events/${eventId}/photos/${photoId}?size=full`, { maxRedirects: 0 });
  expect(link.status()).toBe(302);
  const stored_photo = await page.request.get(link.headers()["location"]!);
  expect(stored_photo.status()).toBe(200);
  expect((await stored_photo.body()).subarray(0, 3)).toEqual(Buffer.from([0xff, 0xd8, 0xff])); // a JPEG

  // Offline and online again: nothing new goes out or gets stored.
  await context.setOffline(true);
  await context.setOffline(false);
  await page.getByRole("heading", { level: 2, name: EVENT }).waitFor();
  // The same batch sent again by hand: every record is answered "already had".
  const resend = await page.evaluate(
    async ({ eventId, sessions, sightings }) => {
      const res = await fetch(`/api/events/${eventId}/sync`, {
        method: "POST",
        headers: { "content-type": "application/json" },
        body: JSON.stringify({ sessions, sightings }),
      });
      return { status: res.status, body: await res.json() };
    },
    { eventId, sessions: ids.sessions.map((s) => s.record), sightings: thisSession.map((s) => s.record) },
  );
  expect(resend.status).toBe(200);
  expect(resend.body.acks).toHaveLength(6);
  expect(new Set(resend.body.acks.map((a: { outcome: string }) => a.outcome))).toEqual(new Set(["already_had"]));
  const after = await withE2eDb(async (c) => ({
    total: (
      await c.query(
        `SELECT count(*)::int AS n FROM sightings s JOIN users u ON u.id = s.user_id WHERE u.email = $1 AND s.event_id = $2`,
        [DEMO.volunteer, eventId],
      )
    ).rows[0].n as number,
    sessions: (
      await c.query(
        `SELECT count(*)::int AS n FROM count_sessions s JOIN users u ON u.id = s.user_id WHERE u.email = $1 AND s.event_id = $2`,
        [DEMO.volunteer, eventId],
      )
    ).rows[0].n as number,
  }));
  expect(after.total).toBe(before + 5);
  expect(after.sessions).toBe(sessionsBefore + 1);
});

// A real browser profile on disk: installability is not offered in a throw-away profile,
// and a restart needs a profile to come back to.
test("Chromium finds the field log installable, and it opens offline after the browser restarts", async ({}, testInfo) => {
  const dir = testInfo.outputPath("profile");
  const use = testInfo.project.use;
  const launch = () =>
    chromium.launchPersistentContext(dir, {
      ...use.launchOptions,
      baseURL: use.baseURL,
      geolocation: { latitude: 53.3045, longitude: -2.095, accuracy: 8 },
      permissions: ["geolocation"],
    });
  let context = await launch();
  let page = context.pages()[0] ?? (await context.newPage());
  await signInWithPassword(page, DEMO.volunteer);
  await openFieldLog(page);
  const cdp = await context.newCDPSession(page);
  const { installabilityErrors } = await cdp.send("Page.getInstallabilityErrors");
  expect(installabilityErrors).toEqual([]);
  const manifest = await (await page.request.get("/manifest.webmanifest")).json();
  expect(manifest).toMatchObject({ display: "standalone", start_url: "/field" });
  expect(manifest.icons.map((i: { sizes: string }) => i.sizes)).toEqual(expect.arrayContaining(["192x192", "512x512"]));
  await context.close();

  context = await launch();
  await context.setOffline(true);
  page = context.pages()[0] ?? (await context.newPage());
  // The installed app's start address, with no network: the field log in the language used last.
  await page.goto("/field");
  await expect(page).toHaveURL(/\/en\/field/);
  await expect(page.getByRole("heading", { level: 2, name: EVENT })).toBeVisible();
  await expect(page.getByText("No connection — records stay safe on this phone")).toBeVisible();
  await addSighting(page, "dunnock", /Dunnock/);
  await expect(
    page.getByRole("list", { name: "On this phone" }).getByRole("listitem").filter({ hasText: "Dunnock" }),
  ).toContainText("Waiting");
  await context.close();
});

/** The sighting this page saved last (its id, from the phone's own store). */
async function lastSavedId(page: Page): Promise<string> {
  return page.evaluate(async () => {
    const open = indexedDB.open("ecotone-field");
    const idb: IDBDatabase = await new Promise((res, rej) => {
      open.onsuccess = () => res(open.result);
      open.onerror = () => rej(open.error);
    });
    const all = await new Promise<{ id: string; savedAt: number; rev: number }[]>((res) => {
      const r = idb.transaction("sightings").objectStore("sightings").getAll();
      r.onsuccess = () => res(r.result);
    });
    idb.close();
    return all.filter((s) => s.rev > 0).sort((a, b) => b.savedAt - a.savedAt)[0]!.id;
  });
}

const storedOnServer = (id: string) =>
  withE2eDb(async (c) => (await c.query(`SELECT count(*)::int AS n FROM sightings WHERE id = $1`, [id])).rows[0].n);

// The send waits for a pause after a save (issue 18: the save returns without waiting behind
// the sender): it still goes while the page stays open, and a sighting whose page was closed
// straight after the save is sent on the next opening of the field log (or by the service worker).
test("a sighting saved online is sent after the pause with the page open, and one whose page closed at once is sent by the next opening", async ({
  page,
  context,
}) => {
  await signInWithPassword(page, DEMO.volunteer);
  await openFieldLog(page);
  await addSighting(page, "robin", /European robin/);
  const first = await lastSavedId(page);
  // Shown at once as waiting on the phone, then sent with the page left open.
  await expect(
    page.getByRole("list", { name: "On this phone" }).getByRole("listitem").filter({ hasText: "European robin" }),
  ).toHaveCount(1);
  await expect.poll(() => storedOnServer(first), { timeout: 30_000 }).toBe(1);
  await expect(page.getByText("Everything is sent.")).toBeVisible({ timeout: 30_000 });

  await addSighting(page, "wren", /Eurasian wren/);
  const second = await lastSavedId(page);
  await page.close();
  const next = await context.newPage();
  await openFieldLog(next);
  await expect.poll(() => storedOnServer(second), { timeout: 30_000 }).toBe(1);
  await expect(next.getByText("Everything is sent.")).toBeVisible({ timeout: 30_000 });
  expect(await storedOnServer(first)).toBe(1);
});
