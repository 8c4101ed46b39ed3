// The field log's save, as the bench's save timing (scripts/bench-lighthouse.mts) and its
// profiler (scripts/profile-save.mts) both drive it: open the demo's Kestrel Moor event on a
// signed-in page, then save a robin the way a volunteer taps it.
import type { BrowserContext, Page } from "@playwright/test";

/** Opens the field log on the demo event and waits until a sighting can be added; CPU slowed 4×. */
export async function openFieldLogForSaves(context: BrowserContext): Promise<Page> {
  const page = await context.newPage();
  await page.goto("/en/field");
  const pick = page.getByRole("button", { name: /Kestrel Moor Winter Count/ });
  const heading = page.getByRole("heading", { level: 2, name: "Kestrel Moor Winter Count" });
  await pick.or(heading).first().waitFor();
  if (await pick.isVisible()) await pick.click();
  await page.getByRole("button", { name: "Add sighting" }).and(page.locator(":enabled")).waitFor({ timeout: 30_000 });
  const cdp = await context.newCDPSession(page);
  await cdp.send("Emulation.setCPUThrottlingRate", { rate: 4 });
  return page;
}

/** One save: the form, the species, the phone's position, "Save sighting" (again if a check mark is said once). */
export async function saveOneRobin(page: Page): Promise<void> {
  await page.getByRole("button", { name: "Add sighting" }).click();
  const form = page.getByRole("form", { name: "New sighting" });
  await form.getByRole("searchbox", { name: "Species" }).fill("robin");
  await form
    .getByRole("list", { name: "Matching species" })
    .getByRole("button", { name: /European robin/ })
    .first()
    .click();
  await form.getByText(/From the phone:/).waitFor();
  const save = form.getByRole("button", { name: "Save sighting" });
  await save.click();
  // A check mark the phone sees is said once; the same tap again saves.
  await form.waitFor({ state: "hidden", timeout: 5_000 }).catch(async () => {
    if (await page.getByText("Save anyway").isVisible()) await save.click({ timeout: 5_000 }).catch(() => {});
    await form.waitFor({ state: "hidden", timeout: 60_000 });
  });
}
