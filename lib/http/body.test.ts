import { describe, expect, it } from "vitest";
import { z } from "zod";
import { jsonDepthExceeds, MAX_JSON_DEPTH, parseJson } from "./body";
import { ApiError, errorResponse, handle } from "./errors";

const schema = z.object({ a: z.unknown() }).strict();
const post = (body: string, contentType: string | null, lang = "en") =>
  new Request("http://localhost:3000/api/x", {
    method: "POST",
    body,
    headers: { ...(contentType === null ? {} : { "content-type": contentType }), "accept-language": lang },
  });
const refusal = async (p: Promise<unknown>) => {
  try {
    await p;
  } catch (e) {
    if (e instanceof ApiError) return e;
    throw e;
  }
  throw new Error("expected a refusal");
};

describe("JSON bodies", () => {
  it("thousands of levels of nesting are refused with a 400 before anything walks them", async () => {
    for (const deep of [
      "[".repeat(5000) + "]".repeat(5000),
      `{"a":${'{"b":'.repeat(5000)}1${"}".repeat(5000)}}`,
      // Unbalanced too: the scan stops at the limit, whatever follows.
      "[".repeat(100_000),
    ]) {
      const started = performance.now();
      const e = await refusal(parseJson(post(deep, "application/json"), schema));
      expect(performance.now() - started).toBeLessThan(1000);
      expect(e.code).toBe("bad_request");
      expect(e.fields).toEqual([
        { field: "(body)", message: `The body is nested too deeply (at most ${MAX_JSON_DEPTH} levels).` },
      ]);
    }
    // Brackets inside strings are text, not nesting; and a deep but allowed body still parses.
    const inString = JSON.stringify({ a: "[{".repeat(5000) });
    await expect(parseJson(post(inString, "application/json"), schema)).resolves.toEqual({ a: "[{".repeat(5000) });
    const allowed = "[".repeat(MAX_JSON_DEPTH - 1) + "]".repeat(MAX_JSON_DEPTH - 1);
    await expect(parseJson(post(`{"a":${allowed}}`, "application/json"), schema)).resolves.toBeTruthy();
    expect(jsonDepthExceeds(`{"a":"\\"[[[["}`, 1)).toBe(false);
  });

  it("a body not sent as application/json is a 415 with its own code, in the caller's language", async () => {
    for (const type of [
      null,
      "text/plain;charset=UTF-8",
      "application/x-www-form-urlencoded",
      "application/jsonp",
      "multipart/form-data; boundary=x",
    ]) {
      const e = await refusal(parseJson(post('{"a":1}', type), schema));
      expect(e.code, String(type)).toBe("unsupported_media_type");
      const res = errorResponse(e, "es");
      expect(res.status).toBe(415);
      const body = await res.json();
      expect(body.error.code).toBe("unsupported_media_type");
      expect(body.error.message).toMatch(/^El cuerpo debe ser JSON/);
      expect(body.error.fields[0].field).toBe("(content-type)");
    }
    for (const type of ["application/json", "application/json; charset=utf-8", "Application/JSON"])
      await expect(parseJson(post('{"a":1}', type), schema), type).resolves.toEqual({ a: 1 });
  });

  it("through a handler: 415 and 400 answers, never a 500", async () => {
    const route = handle(async (request: Request) => Response.json(await parseJson(request, schema)));
    expect((await route(post('{"a":1}', "text/plain"), {})).status).toBe(415);
    expect((await route(post("[".repeat(20_000), "application/json"), {})).status).toBe(400);
    expect((await route(post('{"a":1}', "application/json"), {})).status).toBe(200);
  });
});
