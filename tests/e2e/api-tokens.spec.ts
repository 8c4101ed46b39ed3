import { DEMO, expect, signInWithPassword, test } from "./support";
import { demoIds } from "./demo-ids";

// issue 19, "Done when": an organiser makes a token on the event's API screen, a script
// pulls approved sightings with it, the token is revoked on the screen, and the next pull
// is refused.
test("an organiser's API token pulls approved sightings until it is revoked", async ({ page, playwright, baseURL }) => {
  const { eventId } = await demoIds();
  await signInWithPassword(page, DEMO.organiser);
  await page.goto("/en/events/harrowmere-vale-midsummer-count/setup");
  await page.getByRole("navigation", { name: "Setup sections" }).getByRole("link", { name: "API" }).click();
  await expect(page.getByRole("heading", { name: "Read-only API" })).toBeVisible();

  const name = `County records centre ${Date.now()}`;
  const form = page.getByRole("form", { name: "New token" });
  await form.getByLabel("Name").fill(name);
  await form.getByLabel("Reads").selectOption({ label: "This event only" });
  await form.getByLabel("Expires after").selectOption({ label: "30 days" });
  await form.getByRole("button", { name: "Create token" }).click();
  await expect(page.getByText("it is shown only once")).toBeVisible();
  const secret = await page.getByLabel("Token to copy").inputValue();
  expect(secret).toMatch(/^eco_[A-Za-z0-9_-]{43}$/);
  const row = page.getByRole("row", { name: new RegExp(name) });
  await expect(row).toContainText(secret.slice(0, 12));
  await expect(row).toContainText("never");
  await expect(row).toContainText("Active");

  // The script: no session, only the token.
  const script = await playwright.request.newContext({
    baseURL,
    extraHTTPHeaders: { authorization: `Bearer ${secret}` },
  });
  const first = await script.get(`/api/v1/events/${eventId}/sightings?limit=20`);
  expect(first.status()).toBe(200);
  const body = await first.json();
  expect(body.records.length).toBe(20);
  expect(body.nextCursor).toBeTruthy();
  for (const r of body.records) {
    expect(r.occurrenceID).toMatch(/^urn:uuid:/);
    expect(r.basisOfRecord).toBe("HumanObservation");
  }
  const csv = await script.get(`/api/v1/events/${eventId}/sightings?format=csv&limit=5&cursor=${body.nextCursor}`);
  expect(csv.headers()["content-type"]).toMatch(/text\/csv/);
  expect((await csv.text()).split("\r\n")[0]).toMatch(/^occurrenceID,basisOfRecord,eventDate,/);
  // A token never writes.
  expect((await script.post(`/api/v1/events/${eventId}/sightings`, { data: {} })).status()).toBe(405);

  await page.reload();
  await expect(page.getByRole("row", { name: new RegExp(name) })).not.toContainText("never");

  await page.getByRole("button", { name: `Revoke ${name}` }).click();
  await expect(page.getByRole("row", { name: new RegExp(name) })).toContainText("Revoked");
  const refused = await script.get(`/api/v1/events/${eventId}/sightings?limit=50`);
  expect(refused.status()).toBe(401);
  expect((await refused.json()).error.code).toBe("api_token_refused");
  await script.dispose();
});

test("the API reference page and the OpenAPI document are served by the app itself", async ({
  page,
  request,
  baseURL,
}) => {
  const doc = await (await request.get("/api/openapi.json")).json();
  expect(doc.openapi).toBe("3.1.0");
  expect(Object.keys(doc.paths)).toContain("/api/v1/events/{eventId}/sightings");
  const outside: string[] = [];
  page.on("request", (r) => {
    if (!r.url().startsWith(baseURL!) && !r.url().startsWith("data:")) outside.push(r.url());
  });
  await page.goto("/es/api-reference");
  await expect(page.getByRole("heading", { level: 1, name: "Referencia de la API de Ecotone" })).toBeVisible();
  await expect(page.getByRole("heading", { name: "Avistamientos aprobados en Darwin Core" })).toBeVisible();
  await expect(page.getByText("GET /api/v1/events/{eventId}/sightings").first()).toBeVisible();
  expect(outside).toEqual([]);
});
