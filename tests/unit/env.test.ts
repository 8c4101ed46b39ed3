import { describe, expect, it } from "vitest";
import { loadEnv } from "@/lib/env";

const secret = "q6Qm1aV0o3m0qk4m8V2l7t3x9b5n1c6z0r4e8w2y7u=";

describe("production settings", () => {
  it("refuses the demo's AUTH_SECRET in production, naming the variable and how to make one", () => {
    expect(() => loadEnv({ NODE_ENV: "production" })).toThrow(/AUTH_SECRET is the demo's default/);
    expect(() => loadEnv({ NODE_ENV: "production" })).toThrow(/openssl rand -base64 32/);
  });

  it("accepts a secret of one's own with the S3 fake on loopback", () => {
    const e = loadEnv({ NODE_ENV: "production", AUTH_SECRET: secret, S3_ENDPOINT: "http://127.0.0.1:9000" });
    expect(e.AUTH_SECRET).toBe(secret);
    expect(e.S3_ACCESS_KEY_ID).toBe("S3RVER");
  });

  it("refuses the S3 fake's keys for a photo store that is not on loopback", () => {
    const source = { NODE_ENV: "production", AUTH_SECRET: secret, S3_ENDPOINT: "https://photos.example.org" };
    expect(() => loadEnv(source)).toThrow(/S3_ACCESS_KEY_ID is the S3 fake's "S3RVER"/);
    expect(() => loadEnv(source)).toThrow(/S3_SECRET_ACCESS_KEY is the S3 fake's "S3RVER"/);
    const e = loadEnv({ ...source, S3_ACCESS_KEY_ID: "AKIA-own-key", S3_SECRET_ACCESS_KEY: "own-secret-key" });
    expect(e.S3_ENDPOINT).toBe("https://photos.example.org");
  });

  it("names every unsafe setting at once", () => {
    expect(() => loadEnv({ NODE_ENV: "production", S3_ENDPOINT: "https://photos.example.org" })).toThrow(
      /AUTH_SECRET[\s\S]*S3_ACCESS_KEY_ID[\s\S]*S3_SECRET_ACCESS_KEY/,
    );
  });

  it("leaves the demo defaults alone outside production and while `next build` runs", () => {
    expect(loadEnv({}).AUTH_SECRET).toBe("ecotone-demo-secret-change-me-in-production");
    expect(loadEnv({ NODE_ENV: "test" }).NODE_ENV).toBe("test");
    expect(loadEnv({ NODE_ENV: "production", NEXT_PHASE: "phase-production-build" }).NODE_ENV).toBe("production");
  });
});

describe("the base map's tile address", () => {
  it("defaults to the tile fake on loopback and puts its origin in the page's CSP", async () => {
    const { loadEnv } = await import("@/lib/env");
    const { contentSecurityPolicy, extraOriginsOf } = await import("@/lib/security/csp");
    const e = loadEnv({ CSP_EXTRA_ORIGINS: "http://127.0.0.1:9000" });
    expect(e.MAP_TILE_URL).toBe("http://127.0.0.1:9200/tiles/{z}/{x}/{y}.png");
    expect(extraOriginsOf(e)).toEqual(["http://127.0.0.1:9000", "http://127.0.0.1:9200"]);
    const csp = contentSecurityPolicy({ nonce: "n", dev: false, https: false, extraOrigins: extraOriginsOf(e) });
    expect(csp).toContain("img-src 'self' blob: data: http://127.0.0.1:9000 http://127.0.0.1:9200");
    expect(csp).toContain("connect-src 'self' http://127.0.0.1:9000 http://127.0.0.1:9200");
  });

  it("takes a deployment's tile server and refuses an address without {z}, {x} and {y}", async () => {
    const { loadEnv } = await import("@/lib/env");
    const { extraOriginsOf } = await import("@/lib/security/csp");
    const e = loadEnv({ MAP_TILE_URL: "https://tiles.example.org/base/{z}/{x}/{y}.png" });
    expect(extraOriginsOf(e)).toEqual(["https://tiles.example.org"]);
    expect(() => loadEnv({ MAP_TILE_URL: "https://tiles.example.org/base.png" })).toThrow(/MAP_TILE_URL/);
  });
});

describe("database connections (db/roles.ts)", () => {
  it("by default, connects the app as ecotone_app and migrates as the owner ecotone", () => {
    const e = loadEnv({});
    expect(new URL(e.DATABASE_URL).username).toBe("ecotone_app");
    expect(new URL(e.DATABASE_OWNER_URL).username).toBe("ecotone");
    expect(new URL(e.DATABASE_URL).pathname).toBe(new URL(e.DATABASE_OWNER_URL).pathname);
  });

  it("keeps a one-role set-up working: DATABASE_URL alone is used for migrations too", () => {
    const url = "postgres://survey:pw@db.example.org:5432/ecotone";
    expect(loadEnv({ DATABASE_URL: url }).DATABASE_OWNER_URL).toBe(url);
    const owner = "postgres://owner:pw@db.example.org:5432/ecotone";
    expect(loadEnv({ DATABASE_URL: url, DATABASE_OWNER_URL: owner })).toMatchObject({
      DATABASE_URL: url,
      DATABASE_OWNER_URL: owner,
    });
  });
});
