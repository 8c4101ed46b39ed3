import type { Locator, Page } from "@playwright/test";
import en from "../../messages/en.json";
import { keyLabel } from "../../lib/review/decisions";
import { DEMO, expect, signInWithPassword, test } from "./support";

// Issue 17, keyboard only: the field log's sighting form and the review desk's decision forms
// walked with Tab, Shift+Tab, Enter and Esc alone. Focus goes into what opens, stays inside
// it while walking (the desk's bulk confirmation is modal: Tab goes round it), is never hidden
// behind the fixed bar at the bottom, and returns to the opener when Esc closes it. Nothing
// is decided or saved: the demo's records stay as they are.

const SLUG = "harrowmere-vale-midsummer-count";
const FIELD_EVENT = "Kestrel Moor Winter Count";
test.use({ geolocation: { latitude: 53.3045, longitude: -2.095, accuracy: 8 }, permissions: ["geolocation"] });

const isFocused = (l: Locator) => l.evaluate((el) => el === document.activeElement);

/** Presses Tab (Shift+Tab with `back`) until `target` has the focus; fails after `max` presses. */
async function tabTo(page: Page, target: Locator, { back = false, max = 150 } = {}) {
  for (let i = 0; i < max; i++) {
    if (await isFocused(target)) return;
    await page.keyboard.press(back ? "Shift+Tab" : "Tab");
  }
  expect(await isFocused(target), `focus never reached ${target}`).toBe(true);
}

/** What has the focus: its accessible-ish name, whether it is inside `container`, and whether a fixed bar hides it. */
function focusState(container: Locator) {
  return container.evaluate((box) => {
    const el = document.activeElement as HTMLElement | null;
    if (!el || el === document.body) return { name: "(body)", inside: false, hidden: false };
    const rect = el.getBoundingClientRect();
    // Fixed bars that the focused control is not part of must not cover it.
    const bars = [...document.querySelectorAll<HTMLElement>("body *")].filter(
      (b) => getComputedStyle(b).position === "fixed" && !b.contains(el) && b.getClientRects().length,
    );
    const hidden = bars.some((b) => {
      const r = b.getBoundingClientRect();
      return r.top < rect.bottom - 1 && r.bottom > rect.top + 1 && r.left < rect.right && r.right > rect.left;
    });
    const name =
      el.getAttribute("aria-label") ||
      (el.id && document.querySelector(`label[for="${el.id}"]`)?.textContent) ||
      el.textContent?.trim().slice(0, 40) ||
      el.tagName;
    return { name, inside: box.contains(el), hidden };
  });
}

/** Walks `steps` Tab presses (Shift+Tab with `back`) and checks that focus stays inside `container`, in view. */
async function walk(page: Page, container: Locator, steps: number, back = false) {
  const seen: string[] = [];
  for (let i = 0; i < steps; i++) {
    await page.keyboard.press(back ? "Shift+Tab" : "Tab");
    const s = await focusState(container);
    seen.push(s.name);
    expect(s.inside, `focus left the form at step ${i + 1}: ${seen.join(" → ")}`).toBe(true);
    expect(s.hidden, `focus hidden behind a fixed bar at ${s.name}`).toBe(false);
  }
  return seen;
}

test("field log: the sighting form with the keyboard alone", async ({ browser }) => {
  test.setTimeout(120_000);
  const context = await browser.newContext({
    geolocation: { latitude: 53.3045, longitude: -2.095, accuracy: 8 },
    permissions: ["geolocation"],
    viewport: { width: 390, height: 844 },
  });
  const page = await context.newPage();
  await signInWithPassword(page, DEMO.volunteer);
  await page.goto("/en/field");
  const pick = page.getByRole("button", { name: new RegExp(FIELD_EVENT) });
  const heading = page.getByRole("heading", { level: 2, name: FIELD_EVENT });
  await expect(pick.or(heading)).toBeVisible();
  if (await pick.isVisible()) {
    await tabTo(page, pick);
    await page.keyboard.press("Enter");
  }
  const add = page.getByRole("button", { name: en.FieldLog.addSighting });
  await expect(add).toBeEnabled({ timeout: 20_000 });
  await tabTo(page, add);
  await page.keyboard.press("Enter");

  const form = page.getByRole("form", { name: en.FieldLog.addTitle });
  await expect(form).toBeVisible();
  const search = form.getByRole("searchbox", { name: en.FieldLog.species });
  await expect(search).toBeFocused();
  await page.keyboard.type("robin");
  const firstHit = form.getByRole("list", { name: en.FieldLog.speciesResults }).getByRole("button").first();
  await expect(firstHit).toBeVisible();
  await page.keyboard.press("Tab");
  await expect(firstHit).toBeFocused();
  // Choosing a species keeps the focus in the form, on its Change button.
  await page.keyboard.press("Enter");
  await expect(form.getByRole("button", { name: en.FieldLog.changeSpecies })).toBeFocused();
  // Every control after it, down to Save, in order and in view; and back up again.
  const save = form.getByRole("button", { name: en.FieldLog.save });
  const forward: string[] = [];
  for (let i = 0; i < 40 && !(await isFocused(save)); i++) forward.push(...(await walk(page, form, 1)));
  await expect(save).toBeFocused();
  expect(forward).toContain(en.FieldLog.count);
  expect(forward).toContain(en.FieldLog.cancel);
  await walk(page, form, forward.length, true);
  await expect(form.getByRole("button", { name: en.FieldLog.changeSpecies })).toBeFocused();

  // Esc closes the form without saving; focus returns to "Add sighting".
  await page.keyboard.press("Escape");
  await expect(form).toHaveCount(0);
  await expect(add).toBeFocused();
  await context.close();
});

test("review desk: the decision forms and the bulk confirmation with the keyboard alone", async ({ browser }) => {
  test.setTimeout(120_000);
  const context = await browser.newContext({ viewport: { width: 1280, height: 800 } });
  const page = await context.newPage();
  await signInWithPassword(page, DEMO.coordinator);
  await page.goto(`/en/events/${SLUG}/review`);
  await expect(page.getByRole("heading", { level: 1, name: en.ReviewDesk.title })).toBeVisible();
  const firstRow = page
    .getByRole("table", { name: en.ReviewDesk.queue.title })
    .getByRole("row")
    .filter({ has: page.getByRole("cell") })
    .first()
    .getByRole("button")
    .first();
  await tabTo(page, firstRow);
  await page.keyboard.press("Enter");
  await expect(page.getByRole("heading", { level: 3, name: en.ReviewDesk.detail.history })).toBeVisible();

  const a = en.ReviewDesk.actions;
  // Reject: the reason, the note, Save decision and Cancel, forward and back, all inside the form.
  const reject = page.getByRole("button", { name: `${a.reject} ${keyLabel("reject")}`, exact: true });
  await tabTo(page, reject);
  await page.keyboard.press("Enter");
  const rejectForm = page.getByRole("form", { name: a.reject });
  await expect(rejectForm.getByLabel(a.reason)).toBeFocused();
  expect(await walk(page, rejectForm, 3)).toEqual([a.note, a.submit, a.cancel]);
  expect(await walk(page, rejectForm, 3, true)).toEqual([a.submit, a.note, a.reason]);
  await page.keyboard.press("Escape");
  await expect(rejectForm).toHaveCount(0);
  await expect(reject).toBeFocused();

  // Return with a question: the question first; Esc gives focus back to its button.
  const ret = page.getByRole("button", { name: `${a.return} ${keyLabel("returnWithQuestion")}`, exact: true });
  await page.keyboard.press("Tab");
  await expect(ret).toBeFocused();
  await page.keyboard.press("Enter");
  const returnForm = page.getByRole("form", { name: a.return });
  await expect(returnForm.getByLabel(a.question)).toBeFocused();
  expect(await walk(page, returnForm, 2)).toEqual([a.submit, a.cancel]);
  await page.keyboard.press("Escape");
  await expect(returnForm).toHaveCount(0);
  await expect(ret).toBeFocused();

  // Re-identify: the taxon search, the note and the buttons (disabled until a taxon is chosen), then Cancel.
  const reid = page.getByRole("button", { name: `${a.reidentify} ${keyLabel("reidentify")}`, exact: true });
  await page.keyboard.press("Tab");
  await expect(reid).toBeFocused();
  await page.keyboard.press("Enter");
  const group = page.getByRole("group", { name: a.reidentify });
  await expect(group.getByRole("combobox", { name: a.taxonSearch })).toBeFocused();
  await page.keyboard.type("common");
  const listbox = group.getByRole("listbox", { name: a.taxonResults });
  await expect(listbox.getByRole("option").first()).toBeVisible();
  await page.keyboard.press("ArrowDown");
  await page.keyboard.press("Enter");
  await expect(group.getByRole("button", { name: a.reidentifyApprove })).toBeFocused();
  expect(await walk(page, group, 2)).toEqual([a.reidentify, a.cancel]);
  expect(await walk(page, group, 3, true)).toEqual([a.reidentify, a.reidentifyApprove, a.note]);
  await page.keyboard.press("Escape");
  await expect(group).toHaveCount(0);
  await expect(reid).toBeFocused();

  // The bulk confirmation is modal: Tab and Shift+Tab go round inside it; Esc closes it, focus back on its button.
  const bulk = page.getByRole("button", { name: `${a.bulk} ${keyLabel("bulk")}`, exact: true });
  await tabTo(page, bulk, { back: true });
  await page.keyboard.press("Enter");
  const dialog = page.getByRole("alertdialog");
  await expect(dialog.getByRole("button", { name: a.cancel })).toBeVisible();
  await expect.poll(() => focusState(dialog).then((s) => s.inside)).toBe(true);
  await walk(page, dialog, 8);
  await walk(page, dialog, 8, true);
  await page.keyboard.press("Escape");
  await expect(dialog).toHaveCount(0);
  await expect(bulk).toBeFocused();
  await context.close();
});
