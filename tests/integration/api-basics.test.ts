import { describe, expect, it } from "vitest";
import { GET as health, POST as healthPost } from "@/app/api/health/route";
import { GET as unknownApi } from "@/app/api/[...path]/route";

// The route handlers themselves, called as Next calls them, against the real test database.
const noCtx = {} as never;

describe("GET /api/health", () => {
  it("reports the database reachable, with PostGIS", async () => {
    const res = await health(new Request("http://localhost/api/health"), noCtx);
    expect(res.status).toBe(200);
    const body = await res.json();
    expect(body).toMatchObject({ status: "ok", database: { reachable: true } });
    expect(body.database.postgis).toMatch(/^3\./);
  });

  it("answers an unknown parameter with a 400 naming it, in the caller's language", async () => {
    const res = await health(
      new Request("http://localhost/api/health?verbose=1", { headers: { "accept-language": "es-ES,es;q=0.9" } }),
      noCtx,
    );
    expect(res.status).toBe(400);
    const body = await res.json();
    expect(body.error.code).toBe("bad_request");
    expect(body.error.message).toMatch(/solicitud no es válida/);
    expect(body.error.fields[0]).toMatchObject({ field: "verbose", message: "Campo(s) desconocido(s): verbose." });
    expect(JSON.stringify(body)).not.toMatch(/at \w+ \(|node_modules/);
  });

  it("refuses other methods with a JSON 405", async () => {
    const res = await healthPost(new Request("http://localhost/api/health", { method: "POST" }), noCtx);
    expect(res.status).toBe(405);
    expect((await res.json()).error.code).toBe("method_not_allowed");
  });
});

describe("unknown /api addresses", () => {
  it("get a JSON 404 in French when asked", async () => {
    const res = await unknownApi(
      new Request("http://localhost/api/no-such-thing", { headers: { cookie: "NEXT_LOCALE=fr" } }),
      noCtx,
    );
    expect(res.status).toBe(404);
    expect(res.headers.get("content-type")).toMatch(/application\/json/);
    expect((await res.json()).error).toMatchObject({ code: "not_found", message: "Rien n'existe à cette adresse." });
  });
});

describe("same-origin check on state-changing calls", () => {
  it("refuses a POST from another site before the handler runs", async () => {
    const res = await healthPost(
      new Request("http://localhost:3000/api/health", { method: "POST", headers: { origin: "https://evil.example" } }),
      noCtx,
    );
    expect(res.status).toBe(403);
    const res2 = await healthPost(
      new Request("http://localhost:3000/api/health", { method: "POST", headers: { "sec-fetch-site": "cross-site" } }),
      noCtx,
    );
    expect(res2.status).toBe(403);
  });

  it("lets the same origin through to the handler (here: 405, the handler's own answer)", async () => {
    const res = await healthPost(
      new Request("http://localhost:3000/api/health", { method: "POST", headers: { origin: "http://localhost:3000" } }),
      noCtx,
    );
    expect(res.status).toBe(405);
  });
});
