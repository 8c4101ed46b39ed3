import { expect, test } from "@playwright/test";

const EVENT = "Harrowmere Vale Midsummer Count";

test("the English home page lists the demo event with its organiser, zones and species", async ({ page }) => {
  await page.goto("/en");
  await expect(page.getByRole("heading", { level: 1, name: "Survey events" })).toBeVisible();
  const card = page.getByRole("listitem").filter({ has: page.getByRole("heading", { name: EVENT }) });
  await expect(card).toContainText("Organised by Friends of Harrowmere Vale");
  await expect(card).toContainText("4 zones");
  await expect(card).toContainText("150 species listed");
  await expect(card).toContainText("Recording closed");
});

test("the Spanish home page shows the demo event in Spanish, and the switcher goes back to English", async ({
  page,
}) => {
  await page.goto("/es");
  await expect(page.getByRole("heading", { level: 1, name: "Eventos de censo" })).toBeVisible();
  await expect(page.getByRole("heading", { name: EVENT })).toBeVisible();
  // The organisation's other events (last year's count) are listed too: look inside this event's entry.
  const entry = page.getByRole("listitem").filter({ has: page.getByRole("heading", { name: EVENT }) });
  await expect(entry.getByText("Organizado por Friends of Harrowmere Vale")).toBeVisible();
  await expect(entry.getByText("150 especies en la lista")).toBeVisible();
  await page.getByRole("combobox", { name: "Idioma" }).selectOption("en");
  await expect(page).toHaveURL(/\/en$/);
  await expect(page.getByRole("heading", { level: 1, name: "Survey events" })).toBeVisible();
});

test("the event page shows dates in the event's time zone, the zones and the field-safety caution", async ({
  page,
}) => {
  await page.goto("/en");
  await page.getByRole("link", { name: `Open event page: ${EVENT}` }).click();
  await expect(page.getByRole("heading", { level: 1, name: EVENT })).toBeVisible();
  // 05:00 UTC is 06:00 in London in June (BST).
  await expect(page.getByText(/June 20, 2026.*6:00/)).toBeVisible();
  await expect(page.getByText("Time zone: Europe/London")).toBeVisible();
  const caution = page.getByRole("region", { name: "Before you go out" });
  await expect(caution).toBeVisible();
  await expect(caution).toContainText("ticks");
  await expect(caution).toContainText("Do not handle or disturb wildlife");
  await expect(caution).toContainText("respect private land");
  for (const zone of ["Alder Fringe", "Beechwood Heart", "Harrowmere Meadow", "Millpond Margin"]) {
    await expect(page.getByRole("heading", { level: 3, name: zone })).toBeVisible();
  }
  await expect(page.getByText(/3 species on the list are sensitive/)).toBeVisible();
});

test("the French event page shows the caution in French", async ({ page }) => {
  await page.goto("/fr/events/harrowmere-vale-midsummer-count");
  await expect(page.getByRole("region", { name: "Avant de partir" })).toContainText("tiques");
  await expect(page.locator("html")).toHaveAttribute("lang", "fr");
});

test("unknown addresses get a clean 404: a page in the person's language, JSON under /api", async ({
  page,
  request,
}) => {
  const res = await page.goto("/es/no-existe");
  expect(res?.status()).toBe(404);
  await expect(page.getByRole("heading", { name: "Página no encontrada" })).toBeVisible();

  const api = await request.get("/api/nothing-here");
  expect(api.status()).toBe(404);
  expect(await api.json()).toMatchObject({ error: { code: "not_found" } });

  const bad = await request.get("/api/health?x=%3Cscript%3E");
  expect(bad.status()).toBe(400);
  const body = await bad.text();
  expect(body).not.toContain("<script>");
  expect(JSON.parse(body).error.fields[0].field).toBe("x");
});

test("no page asks for anything outside this machine", async ({ page }) => {
  const outside: string[] = [];
  page.on("request", (r) => {
    const host = new URL(r.url()).hostname;
    if (!["127.0.0.1", "localhost"].includes(host) && !r.url().startsWith("data:")) outside.push(r.url());
  });
  for (const path of ["/en", "/es/events/harrowmere-vale-midsummer-count"]) {
    await page.goto(path);
    await page.waitForLoadState("networkidle");
  }
  expect(outside).toEqual([]);
});
