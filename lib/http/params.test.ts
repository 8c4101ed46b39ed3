import { readdirSync, readFileSync, statSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { z } from "zod";
import { ApiError } from "./errors";
import { parseParams, pathId, pathVersion } from "./params";

const params = (p: Record<string, string>) => Promise.resolve(p);

describe("path parameters", () => {
  it("takes a uuid (any case, given back lower-case) and a report version", async () => {
    const id = "5B7C8F0E-2D1A-4C3B-9E8F-7A6B5C4D3E2F";
    expect(
      await parseParams(params({ eventId: id, version: "12" }), { eventId: pathId, version: pathVersion }),
    ).toEqual({ eventId: id.toLowerCase(), version: 12 });
  });

  it.each([
    "-".repeat(36),
    "0".repeat(36),
    "5b7c8f0e-2d1a-4c3b-9e8f-7a6b5c4d3e2",
    "5b7c8f0e-2d1a-4c3b-9e8f-7a6b5c4d3e2g",
    "'; DROP TABLE x; --",
    "",
  ])("answers 404 for the malformed id %j", async (bad) => {
    const err = await parseParams(params({ eventId: bad }), { eventId: pathId }).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(ApiError);
    expect((err as ApiError).code).toBe("not_found");
  });

  it.each(["0", "-1", "1.5", "01", "1000001", "1e3"])("answers 404 for the report version %j", async (bad) => {
    await expect(parseParams(params({ version: bad }), { version: pathVersion })).rejects.toMatchObject({
      code: "not_found",
    });
  });

  it("checks only the parameters named (a file name keeps its own enum)", async () => {
    await expect(parseParams(params({ file: "other.txt" }), { file: z.enum(["species.csv"]) })).rejects.toMatchObject({
      code: "not_found",
    });
  });
});

// Every handler with a [parameter] in its path parses it with parseParams, and none keeps a uuid pattern of its own.
function routeFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const full = path.join(dir, name);
    return statSync(full).isDirectory() ? routeFiles(full) : name === "route.ts" ? [full] : [];
  });
}

describe("route handlers", () => {
  it("parse their path parameters with the one schema", () => {
    const withParams = routeFiles("app/api").filter((f) => /\[\w+\]/.test(f));
    expect(withParams.length).toBeGreaterThan(15);
    for (const f of withParams) {
      const src = readFileSync(f, "utf8");
      expect(src, f).toMatch(/parseParams\(/);
      expect(src, f).not.toMatch(/\[0-9a-f/);
    }
  });
});
