import { createHash } from "node:crypto";
import { Client } from "pg";
import sharp from "sharp";
import { E2E_DB_URL } from "./demo-ids";
import { expect, signInWithPassword, test } from "./support";

// The field log's server side over real HTTP, as the phone calls it: the event pack with its
// ETag, a sync batch and its resend, a photo through the S3 fake, the caller's own list.
// The phone's own screens and outbox are tested by the field log's browser tests.
const VOLUNTEER = "moor-volunteer@example.org"; // member of the open Kestrel Moor event only
const json = { "accept-language": "en" };

test("a volunteer downloads the pack, syncs a batch twice and uploads a photo", async ({ page, baseURL }) => {
  await signInWithPassword(page, VOLUNTEER);
  const api = page.request;
  const headers = { ...json, origin: baseURL! };

  const eventId = await kestrelEventId();
  expect(eventId).toMatch(/^[0-9a-f-]{36}$/);

  const pack = await api.get(`/api/events/${eventId}/pack`, { headers: json });
  expect(pack.status()).toBe(200);
  const etag = pack.headers()["etag"]!;
  expect(etag).toMatch(/^"/);
  const body = await pack.json();
  expect(body.event).toMatchObject({
    name: "Kestrel Moor Winter Count",
    status: "open",
    languages: ["en", "es", "fr"],
  });
  expect(body.zones.type).toBe("FeatureCollection");
  expect(body.zones.features.map((z: { properties: { name: string } }) => z.properties.name)).toEqual([
    "Gorse Margin",
    "Heather Crest",
  ]);
  const taxon = body.species.find(
    (t: { onList: boolean; names: Record<string, string> }) => t.onList && t.names.en && t.names.es && t.names.fr,
  );
  expect(taxon).toBeTruthy();
  expect((await api.get(`/api/events/${eventId}/pack`, { headers: { ...json, "if-none-match": etag } })).status()).toBe(
    304,
  );

  const session = {
    id: crypto.randomUUID(),
    zoneId: null,
    kind: "walk",
    startedAt: new Date(Date.now() - 3_600_000).toISOString(),
    endedAt: null,
    allSpeciesNoted: false,
    distanceM: null,
    notes: "",
  };
  const good = {
    id: crypto.randomUUID(),
    sessionId: session.id,
    taxonId: taxon.id,
    description: "",
    count: 3,
    countIsEstimate: false,
    observedAt: new Date(Date.now() - 600_000).toISOString(),
    latitude: 53.301,
    longitude: -2.095,
    accuracyM: 12,
    zoneId: null,
    notes: "",
    photoIds: [],
  };
  const bad = { ...good, id: crypto.randomUUID(), count: -1 };
  const sync = () =>
    api.post(`/api/events/${eventId}/sync`, { headers, data: { sessions: [session], sightings: [good, bad] } });
  const first = await sync();
  expect(first.status()).toBe(200);
  expect((await first.json()).acks).toEqual([
    { kind: "session", id: session.id, index: 0, outcome: "created" },
    { kind: "sighting", id: good.id, index: 0, outcome: "created", reviewState: "pending" },
    { kind: "sighting", id: bad.id, index: 1, outcome: "refused", field: "count", reason: "Must be at least 1." },
  ]);
  const again = await (await sync()).json();
  expect(again.acks.map((a: { outcome: string }) => a.outcome)).toEqual(["already_had", "already_had", "refused"]);
  // A refusal the data layer decides (a code) reaches the phone as a reason in the person's language.
  const unknownTaxon = { ...good, id: crypto.randomUUID(), taxonId: crypto.randomUUID() };
  const spanish = await api.post(`/api/events/${eventId}/sync`, {
    headers: { ...headers, "accept-language": "es" },
    data: { sightings: [unknownTaxon] },
  });
  expect((await spanish.json()).acks).toEqual([
    {
      kind: "sighting",
      id: unknownTaxon.id,
      index: 0,
      outcome: "refused",
      field: "taxonId",
      reason: "El servidor no conoce esta especie. Elígela de nuevo en la lista de especies.",
    },
  ]);

  const mine = await (await api.get(`/api/events/${eventId}/sightings/mine`, { headers: json })).json();
  expect(mine.sightings).toHaveLength(1);
  expect(mine.sightings[0]).toMatchObject({
    id: good.id,
    reviewState: "pending",
    version: 1,
    zoneId: expect.any(String),
  });

  // A photo: presigned PUT straight to the photo store, then the server's check.
  const photo = await sharp({ create: { width: 40, height: 30, channels: 3, background: { r: 90, g: 60, b: 30 } } })
    .jpeg()
    .toBuffer();
  const declared = {
    id: crypto.randomUUID(),
    sightingId: good.id,
    contentType: "image/jpeg",
    sizeBytes: photo.length,
    sha256: createHash("sha256").update(photo).digest("hex"),
    width: 40,
    height: 30,
  };
  const presigned = await (await api.post(`/api/events/${eventId}/photos`, { headers, data: declared })).json();
  expect(presigned.uploadUrl).toMatch(/^http:\/\/127\.0\.0\.1:\d+\//);
  expect((await api.put(presigned.uploadUrl, { headers: presigned.headers, data: photo })).status()).toBe(200);
  const confirm = await api.post(`/api/events/${eventId}/photos/${declared.id}/confirm`, { headers });
  expect(await confirm.json()).toMatchObject({ outcome: "created" });
  const link = await api.get(`/api/events/${eventId}/photos/${declared.id}?size=thumb`, { maxRedirects: 0 });
  expect(link.status()).toBe(302);
  const thumb = await api.get(link.headers()["location"]!);
  expect(thumb.status()).toBe(200);
  expect((await sharp(await thumb.body()).metadata()).format).toBe("jpeg");

  // Pages may talk to the photo store: its origin is in the Content-Security-Policy.
  const home = await page.goto("/en");
  const csp = home!.headers()["content-security-policy"]!;
  expect(csp).toContain(`connect-src 'self' ${new URL(presigned.uploadUrl).origin}`);
});

async function kestrelEventId(): Promise<string> {
  const db = new Client({ connectionString: E2E_DB_URL });
  await db.connect();
  try {
    const { rows } = await db.query("SELECT id FROM events WHERE slug = 'kestrel-moor-winter-count'");
    return rows[0].id as string;
  } finally {
    await db.end();
  }
}
