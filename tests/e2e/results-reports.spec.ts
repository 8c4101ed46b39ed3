import { readFileSync } from "node:fs";
import { unzipSync, strFromU8 } from "fflate";
import type { Browser, Page } from "@playwright/test";
import { SENSITIVE_DEMO_RECORDS } from "../../db/seed/sensitive";
import { withE2eDb } from "./demo-ids";
import { DEMO, expect, publishThroughPreview, signInWithPassword, test } from "./support";

const SLUG = "harrowmere-vale-midsummer-count";

/**
 * Setup helper: a coordinator approves one more sighting. The review desk is built on
 * another branch; until it lands, the decision is written straight to the database the
 * way the desk records it (state change plus an append-only review row).
 */
/** A coordinator approves one more pending sighting at the review desk, by keyboard. */
async function coordinatorApprovesOne(browser: Browser): Promise<void> {
  const context = await browser.newContext();
  const desk = await context.newPage();
  await signInWithPassword(desk, DEMO.coordinator);
  await desk.goto(`/en/events/${SLUG}/review`);
  // A vascular plant in Millpond Margin: none of the review desk test's crafted sightings
  // (birds, a nettle outside the area, a daisy in the meadow) is among them.
  await desk.getByLabel("Taxon group").selectOption({ label: "Vascular plants" });
  await desk.getByLabel("Zone").selectOption({ label: "Millpond Margin" });
  const rows = desk
    .getByRole("table", { name: "Queue" })
    .getByRole("row")
    .filter({ has: desk.getByRole("cell") });
  await expect(rows.first()).toContainText("Vascular plants", { timeout: 20_000 });
  await expect(rows.first()).toContainText("Millpond Margin");
  await desk.getByRole("heading", { level: 1, name: "Review desk" }).click();
  await desk.keyboard.press("j");
  await expect(rows.first()).toHaveAttribute("aria-selected", "true");
  await desk.keyboard.press("y");
  await expect(desk.getByRole("status")).toContainText("Approved: ", { timeout: 20_000 });
  await context.close();
}

const latestVersion = () =>
  withE2eDb(async (db) => {
    const { rows } = await db.query<{ v: number }>(
      "SELECT coalesce(max(version), 0)::int AS v FROM reports r JOIN events e ON e.id = r.event_id WHERE e.slug = $1",
      [SLUG],
    );
    return rows[0]!.v;
  });
const resultsDigest = (version: number) =>
  withE2eDb(async (db) => {
    const { rows } = await db.query<{ h: string }>(
      "SELECT md5(r.results::text || r.input_hash || r.changes::text) AS h FROM reports r JOIN events e ON e.id = r.event_id WHERE e.slug = $1 AND r.version = $2",
      [SLUG, version],
    );
    return rows[0]!.h;
  });

async function publish(page: Page, expected: number) {
  expect(await publishThroughPreview(page, SLUG)).toBe(expected);
  await page.goto(`/en/events/${SLUG}/results`);
  await expect(page.getByRole("link", { name: `Version ${expected}`, exact: true })).toBeVisible({ timeout: 20_000 });
}

test("organiser publishes results; the public reads the Spanish report and downloads it; version 2 lists the change", async ({
  page,
  browser,
}) => {
  test.setTimeout(300_000);
  await signInWithPassword(page, DEMO.organiser);
  await page.goto(`/en/events/${SLUG}/results`);
  await expect(page.getByRole("heading", { level: 1 })).toContainText("Results — Harrowmere Vale Midsummer Count");
  // The curves: rarefaction/extrapolation with a solid and a dashed part, accumulation, rank-abundance, zones overlaid.
  for (const name of [
    "Individual-based rarefaction and extrapolation",
    "Sample-based accumulation (Mao Tau) and extrapolation",
    "Rank–abundance",
    "Rarefaction and extrapolation by zone",
  ]) {
    await expect(page.getByRole("figure", { name })).toBeVisible();
  }
  // The demo counts fungi as presence only (the default), so the event gets session-based
  // estimates only and the individual-based curve says why instead of drawing.
  const rarefaction = page.getByRole("figure", { name: "Individual-based rarefaction and extrapolation" });
  await expect(rarefaction).toContainText("counts of presence only are not counts of individuals");
  const accumulation = page.getByRole("figure", { name: "Sample-based accumulation (Mao Tau) and extrapolation" });
  // A chart is drawn when it comes near the screen (issue 18), as a reader scrolls to it.
  await accumulation.scrollIntoViewIfNeeded();
  await expect(accumulation.locator("path.recharts-curve[stroke-dasharray]").first()).toBeAttached();
  await expect(accumulation.getByRole("img").getByText("observed", { exact: true })).toBeVisible();
  // Pending records are stated; the rules are printed.
  await expect(page.getByRole("complementary", { name: "Not yet in these numbers" })).toContainText(
    /\d+ sightings are still pending review/,
  );
  await expect(page.getByTestId("rules")).toContainText("Subspecies fold into their species");
  // The zone comparison names its standard; its sentence says "more"/"fewer" only on a bootstrap interval excluding 0.
  await expect(page.getByRole("heading", { name: "Zones at equal effort" })).toBeVisible();
  await expect(page.getByRole("heading", { name: "Hill numbers along sample size" })).toBeVisible();
  await expect(page.getByRole("heading", { name: "Between zones: shared species and similarity" })).toBeVisible();
  await expect(
    page.getByRole("region", { name: "Zones at equal effort" }).getByText(/Standard: equal coverage of [\d.]+%/),
  ).toBeVisible();
  // Beside last year's count of the reserve (an earlier event of the same site), by the same rule.
  const beside = page.getByRole("region", { name: "Compared with an earlier event of this site" });
  await expect(beside.getByLabel("Earlier event")).toHaveValue(/.+/);
  await expect(beside.getByRole("rowheader", { name: /Midsummer Count 2025, Harrowmere Vale/ })).toBeVisible();
  await expect(beside.getByTestId("events-comparison-sentence")).toContainText(
    /At equal coverage \([\d.]+%\), (Harrowmere Vale Midsummer Count found (more|fewer) species than Midsummer Count 2025, Harrowmere Vale|no clear difference in species between .+ includes 0)/,
  );
  await expect(page.getByTestId("comparison-sentences").getByRole("listitem").first()).toContainText(
    /At equal coverage \([\d.]+%\), (.+ held (more|fewer) species than .+95% bootstrap interval of the difference|no clear difference between .+ includes 0)/,
  );
  await expect(page.getByTestId("comparison-left-out")).toContainText("too few records");
  await expect(page.getByRole("complementary", { name: "Reading these estimates" }).first()).toBeVisible();
  await expect(page.getByRole("row", { name: /Chao2/ }).first()).toContainText("log-normal interval");

  const v1 = (await latestVersion()) + 1;
  await publish(page, v1);
  const v1Digest = await resultsDigest(v1);

  // An anonymous visitor reads version 1 in Spanish and downloads the three files.
  const visitor = await browser.newContext();
  const anon = await visitor.newPage();
  await anon.goto(`/es/events/${SLUG}/reports/${v1}`);
  await expect(anon.getByRole("heading", { level: 1 })).toContainText(`informe, versión ${v1}`);
  await expect(anon.getByRole("heading", { name: "Zonas con igual esfuerzo" })).toBeVisible();
  await expect(anon.getByRole("heading", { name: "Números de Hill según el tamaño de muestra" })).toBeVisible();
  await expect(anon.getByRole("heading", { name: "Entre zonas: especies compartidas y similitud" })).toBeVisible();
  // The comparison with last year's count, as it stood at publishing, without a way to change it.
  const besideV1 = anon.getByRole("region", { name: "Comparado con un evento anterior en este lugar" });
  await expect(besideV1.getByRole("rowheader", { name: /Midsummer Count 2025, Harrowmere Vale/ })).toBeVisible();
  await expect(besideV1.getByRole("combobox")).toHaveCount(0);
  await expect(anon.getByRole("figure", { name: "Rarefacción y extrapolación por individuos" })).toBeVisible();
  await expect(anon.getByText(/Organizado por .+ voluntarios y \d+ coordinadores/)).toBeVisible();
  await expect(
    anon.getByRole("link", { name: "Recalcular este informe a partir de sus entradas registradas" }),
  ).toHaveAttribute("href", /\?check=1$/);
  const observedV1 = await anon.getByTestId("headline-observed").textContent();
  const html = await anon.content();
  const files: Record<string, Buffer> = {};
  for (const label of ["Lista de especies (CSV)", "Archivo Darwin Core (zip)", "Avistamientos (GeoJSON)"]) {
    const [download] = await Promise.all([
      anon.waitForEvent("download"),
      anon.getByRole("link", { name: label }).click(),
    ]);
    files[label] = readFileSync((await download.path())!);
  }
  expect(files["Lista de especies (CSV)"]!.toString("utf8")).toMatch(
    /^scientificName,vernacularName,taxonRank,taxonGroup,individualCount,/,
  );
  const zip = unzipSync(new Uint8Array(files["Archivo Darwin Core (zip)"]!));
  // Darwin Core's Event core (event.txt) with an Occurrence extension (issue 16).
  expect(Object.keys(zip).sort()).toEqual(["eml.xml", "event.txt", "meta.xml", "occurrence.txt"]);
  const geo = JSON.parse(files["Avistamientos (GeoJSON)"]!.toString("utf8")) as { type: string; features: unknown[] };
  expect(geo.type).toBe("FeatureCollection");
  expect(geo.features.length).toBeGreaterThan(100);
  // Not one public byte holds an exact coordinate of a sensitive taxon.
  const publicText = [
    html,
    files["Lista de especies (CSV)"]!.toString("utf8"),
    files["Avistamientos (GeoJSON)"]!.toString("utf8"),
    strFromU8(zip["occurrence.txt"]!),
    strFromU8(zip["event.txt"]!),
  ].join("\n");
  for (const r of SENSITIVE_DEMO_RECORDS) {
    for (const v of [r.lon, r.lat])
      expect(new RegExp(`${String(v).replace(".", "\\.")}(?!\\d)`).test(publicText), String(v)).toBe(false);
  }

  // A coordinator approves one more sighting; the organiser publishes version 2.
  await coordinatorApprovesOne(browser);
  await page.reload();
  await publish(page, v1 + 1);
  await expect(page.getByRole("link", { name: `Version ${v1 + 1}`, exact: true })).toHaveAttribute(
    "href",
    `/en/events/${SLUG}/reports/${v1 + 1}`,
  );
  await page.goto(`/en/events/${SLUG}/reports/${v1 + 1}`);
  await expect(page.getByTestId("changes")).toContainText(`What changed since version ${v1}`);
  await expect(page.getByTestId("changes")).toContainText("Input records: 1 added, 0 removed, 0 changed.");

  // Version 1 is still there, marked superseded, its numbers unchanged.
  await anon.goto(`/es/events/${SLUG}/reports/${v1}`);
  await expect(anon.getByTestId("superseded")).toBeVisible();
  await expect(anon.getByTestId("headline-observed")).toHaveText(observedV1!);
  await anon.goto(`/es/events/${SLUG}/reports/${v1}?check=1`);
  await expect(anon.getByTestId("recompute")).toContainText("✓ Recalculado a partir de sus entradas registradas", {
    timeout: 20_000,
  });
  expect(await resultsDigest(v1)).toBe(v1Digest);
  await visitor.close();
});

test("the live board shows the backlog, completeness and where to look next, polling for updates", async ({
  page,
  browser,
}) => {
  await signInWithPassword(page, DEMO.coordinator);
  await page.goto(`/en/events/${SLUG}/live`);
  const board = page.getByTestId("live-board");
  await expect(board).toBeVisible();
  await expect(board.getByRole("region", { name: "Review backlog" })).toContainText(/Pending: \d+/);
  await expect(board.getByRole("region", { name: "Completeness so far" })).toContainText(
    /of about [\d.,]+ species \(Chao[12], log-normal 95% interval/,
  );
  await expect(board.getByRole("region", { name: "Completeness so far" })).toContainText(
    "Completeness is the share of species found",
  );
  // Beside last year's count of the reserve, by the results page's rule and sentence.
  const beside = board.getByRole("region", { name: "Compared with an earlier event of this site" });
  await expect(beside).toContainText(/Standard: equal coverage of [\d.]+%/);
  await expect(beside.getByRole("listitem").filter({ hasText: "Midsummer Count 2025, Harrowmere Vale" })).toContainText(
    /about [\d.,]+ species at that coverage \(95% interval [\d.,]+–[\d.,]+\)/,
  );
  await expect(beside.getByTestId("live-beside-sentence")).toContainText(
    /At equal coverage \([\d.]+%\), (Harrowmere Vale Midsummer Count found (more|fewer) species than Midsummer Count 2025, Harrowmere Vale|no clear difference in species between .+ includes 0)/,
  );
  await expect(beside).toContainText("recomputed at most once a minute");
  // Pending and returned records, also those in complete sessions, are said to be left out.
  await expect(board.getByTestId("live-pending")).toContainText(
    /\d+ sightings are still pending review and \d+ were returned to their recorder \(\d+ and \d+ of them in complete count sessions\)/,
  );
  // Zones with too few records head "where to look next".
  await expect(page.getByTestId("where-next").getByRole("listitem").first()).toContainText("too few records");
  await expect(page.getByTestId("where-next").getByRole("listitem")).toHaveCount(4);
  const before = await board.getByRole("region", { name: "Review backlog" }).textContent();
  const pendingBefore = Number(/Pending: (\d+)/.exec(before ?? "")![1]);
  await coordinatorApprovesOne(browser);
  // The next poll (every 15 s) shows one fewer pending.
  await expect(board.getByRole("region", { name: "Review backlog" })).toContainText(`Pending: ${pendingBefore - 1}`, {
    timeout: 25_000,
  });
});
