import { demoIds } from "./demo-ids";
import { baseURL } from "../../playwright.config";
import { DEMO, expect, signInWithPassword, test } from "./support";

// Issue 13, strict input: a NUL in a text field is a 422 naming the field; a wrong type says
// what was expected. Over HTTP, against the running server, as the demo coordinator.
test("a NUL in a decision message or the taxa search is refused with a 422 naming the field; wrong types say what was expected", async ({
  page,
}) => {
  const ids = await demoIds();
  await signInWithPassword(page, DEMO.coordinator);
  const headers = { origin: baseURL, "accept-language": "en" };

  const decision = await page.request.post(`/api/events/${ids.eventId}/review/sightings/${ids.sightingId}/decisions`, {
    headers,
    data: { action: "approve", version: 1, message: "looks right\u0000" },
  });
  expect(decision.status()).toBe(422);
  expect((await decision.json()).error.fields).toEqual([
    {
      field: "message",
      message: "Contains a character that cannot be stored (NUL, U+0000). Remove it and send again.",
    },
  ]);

  const search = await page.request.get(`/api/events/${ids.eventId}/review/taxa?q=oak%00`, { headers });
  expect(search.status()).toBe(422);
  expect((await search.json()).error.fields[0].field).toBe("q");

  const wrongType = await page.request.post(`/api/events/${ids.eventId}/review/sightings/${ids.sightingId}/decisions`, {
    headers,
    data: { action: "approve", version: 1.5 },
  });
  expect(wrongType.status()).toBe(400);
  expect((await wrongType.json()).error.fields).toEqual([{ field: "version", message: "Expected a whole number." }]);
});
