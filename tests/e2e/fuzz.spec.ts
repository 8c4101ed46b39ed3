import fc from "fast-check";
import { Client } from "pg";
import { type Browser, type Page, expect, test } from "@playwright/test";
import { demoIds, E2E_DB_URL as DB_URL } from "./demo-ids";
import { ROUTES, type RouteCase } from "./route-table";
import { signInWithPassword } from "./support";

// Routes only the site admin may call are sent by the site admin, every other by the organiser.
async function callers(page: Page, browser: Browser): Promise<(route: RouteCase) => Page> {
  await signInWithPassword(page, "organiser@example.org");
  const admin = await (await browser.newContext()).newPage();
  await signInWithPassword(admin, "admin@example.org");
  return (route) => (route.allowed.includes("organiser") ? page : admin);
}

// Hostile and malformed bodies for every JSON handler in the route table, sent by the
// most trusted demo person allowed (the organiser; the site admin for the admin console) so that the guard lets them reach the
// validation. Never a 5xx; always a structured 4xx naming the field; and when every
// answer was a refusal, no table has a single row more or less.
const TABLES = [
  "users",
  "events",
  "zones",
  "taxa",
  "taxon_names",
  "event_species",
  "event_members",
  "count_sessions",
  "sightings",
  "photos",
  "reviews",
  "reports",
  "invitations",
  "membership_log",
];

const sqlAndHtml = fc.constantFrom(
  "'; DROP TABLE sightings; --",
  '" OR 1=1 --',
  "<script>alert(1)</script>",
  "<img src=x onerror=alert(1)>",
  "../../etc/passwd",
  "%00",
  "\u0000",
  "{{7*7}}",
  "${jndi:ldap://x}",
  "Robert'); DELETE FROM reviews;--",
);
const hostileValue: fc.Arbitrary<unknown> = fc.oneof(
  fc.anything({ maxDepth: 3 }),
  sqlAndHtml,
  fc.string({ unit: "grapheme", maxLength: 40 }),
  fc.constant("x".repeat(200_000)),
  fc.constantFrom(1e308, -1e308, -1, 0, 2 ** 53 + 1, -180.000001, 91, 3.5, Number.MAX_SAFE_INTEGER),
  fc.constantFrom(null, true, false, [], {}, ""),
  fc.constant(JSON.parse("[".repeat(300) + "]".repeat(300))),
  fc.constantFrom("2026-02-30T25:61:00Z", "not-a-date", "0000-00-00", "9999-12-31T23:59:59Z"),
  fc.constantFrom("00000000-0000-0000-0000-000000000000", "not-a-uuid", "'; --"),
);

function paths(value: unknown, prefix: string[] = []): string[][] {
  if (value && typeof value === "object" && !Array.isArray(value)) {
    return Object.entries(value).flatMap(([k, v]) => [[...prefix, k], ...paths(v, [...prefix, k])]);
  }
  if (Array.isArray(value))
    return value.flatMap((v, i) => [[...prefix, String(i)], ...paths(v, [...prefix, String(i)])]);
  return [];
}

function withValueAt(body: unknown, at: string[], value: unknown): unknown {
  if (at.length === 0) return value;
  const copy: Record<string, unknown> = Array.isArray(body)
    ? ([...body] as never)
    : { ...(body as Record<string, unknown>) };
  copy[at[0]!] = withValueAt((body as Record<string, unknown>)?.[at[0]!], at.slice(1), value);
  return copy;
}

async function tableCounts(): Promise<Record<string, number>> {
  const c = new Client({ connectionString: DB_URL });
  await c.connect();
  try {
    const out: Record<string, number> = {};
    for (const t of TABLES) {
      const r = await c.query(`SELECT count(*)::int AS n FROM ${t}`).catch(() => ({ rows: [{ n: -1 }] }));
      out[t] = r.rows[0].n;
    }
    return out;
  } finally {
    await c.end();
  }
}

test("every JSON handler answers hostile input with a structured 4xx and writes nothing", async ({
  page,
  browser,
  baseURL,
}) => {
  test.setTimeout(300_000);
  const caller = await callers(page, browser);

  const ids = await demoIds();
  const before = await tableCounts();
  // A fuzzed body can be a valid new password; put the organiser's back afterwards so
  // the other browser tests can still sign in.
  const admin = new Client({ connectionString: DB_URL });
  await admin.connect();
  const saved = (await admin.query("SELECT password_hash FROM users WHERE email = 'organiser@example.org'")).rows[0]
    .password_hash;
  test.info().attach("note", { body: "organiser password restored after the run" });
  const jsonRoutes = ROUTES.filter((r) => r.method !== "GET" && r.body);
  expect(jsonRoutes.length).toBeGreaterThan(0);
  const problems: string[] = [];
  let accepted = 0;

  for (const route of jsonRoutes) {
    const good = route.body!(ids);
    const targets = paths(good);
    const mutated = targets.length
      ? fc.tuple(fc.constantFrom(...targets), hostileValue).map(([at, v]) => withValueAt(good, at, v))
      : hostileValue;
    const bodies = fc.sample(fc.oneof(mutated, hostileValue), { numRuns: 30, seed: 20261202 });
    for (const body of bodies) {
      const res = await caller(route).request.fetch(route.path(ids), {
        method: route.method,
        headers: { "content-type": "application/json", origin: baseURL! },
        data: JSON.stringify(body) ?? "null",
      });
      const status = res.status();
      const label = `${route.method} ${route.file} → ${status} for ${JSON.stringify(body)?.slice(0, 120)}`;
      if (status >= 500) problems.push(label);
      else if (status >= 400) {
        const json = await res.json().catch(() => null);
        if (!json?.error?.code || typeof json.error.message !== "string")
          problems.push(`${label} (no structured error)`);
        else if (
          (status === 400 || status === 422) &&
          !(
            json.error.fields?.length > 0 &&
            json.error.fields.every((f: { field?: string }) => typeof f.field === "string" && f.field.length > 0)
          )
        ) {
          problems.push(`${label} (no field named)`);
        }
        const text = JSON.stringify(json);
        if (/<script>|onerror=/.test(text) && !/\\u003c|&lt;/.test(text)) {
          // Echoing a hostile fragment inside JSON is harmless, but it must never be reflected as markup.
          if (res.headers()["content-type"]?.includes("text/html")) problems.push(`${label} (reflected as HTML)`);
        }
      } else accepted++;
    }
  }
  await admin.query("UPDATE users SET password_hash = $1 WHERE email = 'organiser@example.org'", [saved]);
  // A fuzzed body can also suspend the demo organisation (a valid admin decision): lift it again.
  await admin.query("UPDATE organisations SET suspended_at = NULL WHERE id = $1", [ids.organisationId]);
  await admin.end();
  expect(problems).toEqual([]);
  if (accepted === 0) expect(await tableCounts()).toEqual(before);
});

// The paths of rows that do not exist (a nil uuid, a mail number no mail has) in the route table.
const ABSENT_UUID = /00000000-0000-[04]000-[08]000-000000000000/;
const ABSENT_NUMBER = /\/999999999(?=\/|$)/;

test("a malformed id in any path (36 dashes, loose hex) is a structured 404, never a 5xx", async ({
  page,
  browser,
  baseURL,
}) => {
  const caller = await callers(page, browser);

  const ids = await demoIds();
  const uuidKeys = (Object.keys(ids) as (keyof typeof ids)[]).filter((k) => /^[0-9a-f-]{36}$/i.test(ids[k]));
  // 36 dashes passed the old loose pattern /^[0-9a-f-]{36}$/ and reached PostgreSQL; the others are near misses.
  const malformed = ["-".repeat(36), "0000000g-0000-4000-8000-000000000000", `${ids.eventId}x`, "0".repeat(36)];
  const problems: string[] = [];
  let tried = 0;
  // Methods a route never accepts answer 405 whatever the path (the token API's writes).
  for (const route of ROUTES.filter((r) => /\[\w+Id\]/.test(r.file) && r.status !== 405)) {
    const good = route.path(ids);
    const variants = new Set<string>();
    for (const bad of malformed) {
      for (const k of uuidKeys) {
        const path = route.path({ ...ids, [k]: bad });
        if (path !== good) variants.add(path);
      }
      if (ABSENT_UUID.test(good)) variants.add(good.replace(ABSENT_UUID, bad));
    }
    // A number where a serial id goes: not a number, negative, a fraction, beyond 2^53.
    if (ABSENT_NUMBER.test(good))
      for (const bad of ["abc", "-1", "1.5", "9".repeat(20)]) variants.add(good.replace(ABSENT_NUMBER, `/${bad}`));
    expect(variants.size, `${route.method} ${route.file} has an id in its path`).toBeGreaterThan(0);
    for (const path of variants) {
      tried++;
      const res = await caller(route).request.fetch(path, {
        method: route.method,
        headers: { "content-type": "application/json", origin: baseURL! },
        data: route.body ? JSON.stringify(route.body(ids)) : undefined,
      });
      const json = await res.json().catch(() => null);
      if (res.status() !== 404 || json?.error?.code !== "not_found")
        problems.push(`${route.method} ${path} → ${res.status()} ${JSON.stringify(json)?.slice(0, 120)}`);
    }
  }
  expect(tried).toBeGreaterThan(20);
  expect(problems).toEqual([]);
});

test("deep nesting, wrong content types and impossible cursor offsets are 4xx answers, never a 5xx", async ({
  page,
  browser,
  baseURL,
}) => {
  const caller = await callers(page, browser);
  const ids = await demoIds();
  const before = await tableCounts();
  const problems: string[] = [];
  const jsonRoutes = ROUTES.filter((r) => r.method !== "GET" && r.body);
  const deep = "[".repeat(5000) + "]".repeat(5000);
  const deepObject = `{"a":${'{"b":'.repeat(5000)}1${"}".repeat(5000)}}`;
  for (const route of jsonRoutes) {
    const good = JSON.stringify(route.body!(ids));
    const shapes: { label: string; type: string; data: string; expect: number }[] = [
      { label: "5000 nested arrays", type: "application/json", data: deep, expect: 400 },
      { label: "5000 nested objects", type: "application/json", data: deepObject, expect: 400 },
      { label: "text/plain", type: "text/plain;charset=UTF-8", data: good, expect: 415 },
      { label: "form", type: "application/x-www-form-urlencoded", data: "a=1", expect: 415 },
      { label: "octet-stream", type: "application/octet-stream", data: good, expect: 415 },
    ];
    for (const shape of shapes) {
      const res = await caller(route).request.fetch(route.path(ids), {
        method: route.method,
        headers: { "content-type": shape.type, origin: baseURL! },
        data: shape.data,
      });
      const json = await res.json().catch(() => null);
      const label = `${route.method} ${route.file} with ${shape.label} → ${res.status()}`;
      if (res.status() >= 500 || !json?.error?.code) problems.push(label);
      else if (res.status() !== shape.expect) problems.push(`${label} (expected ${shape.expect})`);
    }
  }
  // The review queue's cursor: timestamps with offsets PostgreSQL cannot read (+99 answered 500).
  const cursor = (text: string) => Buffer.from(text, "utf8").toString("base64url");
  const uuid = "00000000-0000-4000-8000-000000000000";
  for (const at of [
    "2026-06-21 07:10:00+99",
    "2026-06-21 07:10:00-16:00",
    "2026-06-21 07:10:00+01:99",
    "9999-12-31 23:59:59+15:59",
  ]) {
    const res = await page.request.get(`/api/events/${ids.eventId}/review/queue?cursor=${cursor(`${at}|${uuid}`)}`);
    if (res.status() >= 500) problems.push(`queue cursor ${at} → ${res.status()}`);
    else if (!at.startsWith("9999") && res.status() !== 400)
      problems.push(`queue cursor ${at} → ${res.status()} (expected 400)`);
  }
  expect(problems).toEqual([]);
  expect(await tableCounts()).toEqual(before);
});
