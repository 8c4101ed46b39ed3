import { type Page, type Response } from "@playwright/test";
import { DEMO, expect, signInWithPassword, test } from "./support";
import { withE2eDb } from "./demo-ids";

// The real map (issue 15): the base map comes from the tile fake on loopback (playwright.config.ts);
// the field log keeps the event area's tiles for use without a network; an organiser draws a zone.

test.describe.configure({ timeout: 180_000 });

const FIELD_EVENT = "Kestrel Moor Winter Count";
const isTile = (url: string) => /\/tiles\/\d+\/\d+\/\d+\.png$/.test(url);

async function openFieldLog(page: Page) {
  await page.goto("/en/field");
  const pick = page.getByRole("button", { name: new RegExp(FIELD_EVENT) });
  const heading = page.getByRole("heading", { level: 2, name: FIELD_EVENT });
  await expect(pick.or(heading)).toBeVisible();
  if (await pick.isVisible()) await pick.click();
  await expect(heading).toBeVisible();
  await page.waitForFunction(() => navigator.serviceWorker.controller !== null, undefined, { timeout: 20_000 });
  await page.waitForFunction(
    async () => Boolean(await (await caches.open("ecotone-field-pages")).match("/en/field")),
    undefined,
    { timeout: 20_000 },
  );
}

test.describe("field log map", () => {
  // Inside the demo's "Heather Crest" zone on Kestrel Moor.
  test.use({ geolocation: { latitude: 53.3045, longitude: -2.095, accuracy: 30 }, permissions: ["geolocation"] });

  test("keeps the event area's tiles with the pack and shows the map from them offline", async ({ page, context }) => {
    await signInWithPassword(page, DEMO.volunteer);
    await openFieldLog(page);

    const map = page.getByRole("region", { name: "Map of the event: zones, your sightings and where you are" });
    await expect(map).toBeVisible({ timeout: 20_000 });
    // Our own markers and labels, Leaflet's translated controls, tiles from the tile fake.
    await expect(map.getByText("Heather Crest")).toBeVisible();
    await expect(map.getByRole("button", { name: "Zoom in" })).toBeVisible();
    await expect(map.locator('[title="You are here"]')).toHaveCount(1);
    await expect(map.locator("img.leaflet-tile-loaded").first()).toBeVisible();
    await expect(page.locator('img[src*="marker-icon"]')).toHaveCount(0);

    // The area's tiles, zoom 13 to 17, kept and counted with their size.
    const status = page.getByTestId("offline-tiles");
    await expect(status).toContainText(/Map kept for use without a network: \d+ tiles, [\d.,]+ (kB|MB)\./, {
      timeout: 60_000,
    });
    const total = Number((await status.textContent())!.match(/network: (\d+) tiles/)![1]);
    expect(total).toBeGreaterThan(20);
    const kept = await page.evaluate(async () => (await (await caches.open("ecotone-map-tiles")).keys()).length);
    expect(kept).toBeGreaterThanOrEqual(total);

    // No network at all: the page, the map code and the tiles all come from the service worker.
    await context.setOffline(true);
    const tileAnswers: Response[] = [];
    page.on("response", (r) => {
      if (isTile(r.url())) tileAnswers.push(r);
    });
    await page.reload();
    await expect(page.getByRole("heading", { level: 2, name: FIELD_EVENT })).toBeVisible({ timeout: 20_000 });
    await expect(page.getByText("No connection — records stay safe on this phone")).toBeVisible();
    const offlineMap = page.getByRole("region", {
      name: "Map of the event: zones, your sightings and where you are",
    });
    await expect(offlineMap).toBeVisible({ timeout: 20_000 });
    await expect(offlineMap.locator("img.leaflet-tile-loaded").first()).toBeVisible({ timeout: 20_000 });
    await expect(page.locator('[data-map="svg"]')).toHaveCount(0);
    await expect.poll(() => tileAnswers.length).toBeGreaterThan(0);
    // Every tile that came back came from the service worker's cache (the network is cut).
    expect(tileAnswers.every((r) => r.fromServiceWorker() && r.status() === 200)).toBe(true);
    await expect(page.getByTestId("offline-tiles")).toContainText(`${total} tiles`);
    await context.setOffline(false);
  });
});

test("an organiser draws the area and a zone on the setup map, moves a corner, and the zone is saved", async ({
  page,
}) => {
  await signInWithPassword(page, DEMO.organiser);
  await page.getByRole("link", { name: "Event setup" }).click();
  const create = page.getByRole("form", { name: "New survey event" });
  await create.getByLabel("Event name").fill("Sedge Hollow Map Walk");
  await create.getByLabel("Starts (event time)").fill("2027-06-05T08:00");
  await create.getByLabel("Ends (event time)").fill("2027-06-06T18:00");
  await create.getByLabel("Time zone").fill("Europe/London");
  await create.getByRole("button", { name: "Create the event" }).click();
  await expect(page).toHaveURL(/\/en\/events\/sedge-hollow-map-walk\/setup$/);
  await page.getByRole("link", { name: "Area and zones" }).click();
  await expect(page.getByText("No area or zones yet.")).toBeVisible();

  const editor = page.getByRole("region", { name: "Map for drawing a zone" });
  const pick = page.getByLabel("Zone to draw");
  await expect(pick).toHaveValue("area");
  await expect(editor).toBeVisible();
  const box = (await editor.boundingBox())!;
  const at = (fx: number, fy: number) => ({ position: { x: box.width * fx, y: box.height * fy } });

  // The event's area: four taps.
  for (const [fx, fy] of [
    [0.15, 0.15],
    [0.85, 0.15],
    [0.85, 0.85],
    [0.15, 0.85],
  ] as const)
    await editor.click(at(fx, fy));
  await expect(page.getByRole("status").filter({ hasText: "4 corners" })).toBeVisible();

  // A new zone inside it: three taps, one taken back, two more, then a corner dragged.
  await pick.selectOption({ label: "New zone" });
  const zoneMap = page.getByRole("region", { name: "Map for drawing a zone" });
  await expect(zoneMap).toBeVisible();
  for (const [fx, fy] of [
    [0.35, 0.35],
    [0.65, 0.35],
    [0.5, 0.5],
  ] as const)
    await zoneMap.click(at(fx, fy));
  await page.getByRole("button", { name: "Remove the last corner" }).click();
  for (const [fx, fy] of [
    [0.65, 0.65],
    [0.35, 0.65],
  ] as const)
    await zoneMap.click(at(fx, fy));
  await expect(page.getByRole("status").filter({ hasText: "4 corners" })).toBeVisible();
  const corner = zoneMap.locator('[title="Corner 3: drag to move"]');
  const c = (await corner.boundingBox())!;
  await page.mouse.move(c.x + c.width / 2, c.y + c.height / 2);
  await page.mouse.down();
  await page.mouse.move(c.x + c.width / 2 + 20, c.y + c.height / 2 + 10, { steps: 5 });
  await page.mouse.move(c.x + c.width / 2 + 40, c.y + c.height / 2 + 20, { steps: 5 });
  await page.mouse.up();
  const moved = (await corner.boundingBox())!;
  expect(moved.x).toBeGreaterThan(c.x + 20);

  // Saving without a name is refused on the page; with one, through the upload's checks.
  await page.getByRole("button", { name: "Save zone" }).click();
  await expect(page.getByRole("alert").filter({ hasText: "Give the zone a name." })).toBeVisible();
  await page.getByLabel("Name", { exact: true }).fill("Sedge Hollow");
  await page.getByLabel("Habitat").selectOption({ label: "Wetland" });
  await page.getByRole("button", { name: "Save zone" }).click();
  await expect(page.getByRole("status").filter({ hasText: "Zone saved: Sedge Hollow" })).toBeVisible();
  const table = page.getByRole("table", { name: "Current area and zones" });
  await expect(table.getByRole("rowheader", { name: "Sedge Hollow" })).toBeVisible();
  await expect(table.getByRole("row", { name: /Sedge Hollow/ })).toContainText("Wetland");

  // Stored by PostGIS as drawn: the zone has four corners (five positions), inside the area.
  const stored = await withE2eDb(
    async (c) =>
      (
        await c.query(
          `SELECT z.habitat, ST_NPoints(z.geom) AS points, ST_Within(z.geom, e.area) AS inside
           FROM zones z JOIN events e ON e.id = z.event_id WHERE e.slug = 'sedge-hollow-map-walk'`,
        )
      ).rows,
  );
  expect(stored).toEqual([{ habitat: "wetland", points: 5, inside: true }]);
});

test("the public event page shows the area and zones on the base map, in the visitor's language", async ({ page }) => {
  await page.goto("/fr/events/harrowmere-vale-midsummer-count");
  // The map is drawn when it comes near the screen (issue 18), as a visitor scrolls to the zones.
  await page.getByRole("heading", { level: 2, name: "Zones", exact: true }).scrollIntoViewIfNeeded();
  const map = page.getByRole("region", { name: "Carte de la zone d'étude et des zones de l'événement" });
  await expect(map).toBeVisible({ timeout: 20_000 });
  for (const zone of ["Harrowmere Meadow", "Alder Fringe", "Beechwood Heart", "Millpond Margin"])
    await expect(map.getByText(zone)).toBeVisible();
  await expect(map.getByRole("button", { name: "Zoom avant" })).toBeVisible();
  await expect(map.locator("img.leaflet-tile-loaded").first()).toBeVisible();
  await expect(map.getByText("Fond de carte : le paysage inventé de la démonstration")).toBeVisible();
});
