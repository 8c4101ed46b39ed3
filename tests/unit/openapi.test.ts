import { readdirSync, readFileSync, statSync } from "node:fs";
import path from "node:path";
import { validate, compileErrors } from "@readme/openapi-parser";
import { describe, expect, it } from "vitest";
import { openApiDocument } from "@/app/api/openapi.json/document";
import { dwcOccurrence } from "@/app/api/v1/events/[eventId]/sightings/schema";
import { locales } from "@/lib/i18n/routing";
import { translator } from "@/lib/i18n/translator";
import { DWC_TERMS } from "@/lib/results/exports";

// The OpenAPI description: valid OpenAPI 3.1 by an independent parser, and listing exactly
// the public and token route handlers that exist, with the methods they serve.
const english = translator("en", "ApiReference") as unknown as (key: string) => string;

function routeFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const full = path.join(dir, name);
    if (statSync(full).isDirectory()) return routeFiles(full);
    return name === "route.ts" ? [full] : [];
  });
}

// Public by design, but not part of the API a caller programs against: the sign-in
// machinery of next-auth, and the catch-all that answers 404 for unknown /api addresses.
const NOT_DESCRIBED = ["app/api/auth/[...nextauth]/route.ts", "app/api/[...path]/route.ts"];

const METHODS = ["GET", "POST", "PUT", "PATCH", "DELETE"] as const;

/** Methods a route file serves: exported handlers, less those bound to a 405 stub (readOnly, notAllowed). */
function servedMethods(src: string): string[] {
  const stubbed = new Set(
    [...src.matchAll(/export \{([^}]*)\}/g)].flatMap((m) =>
      [...m[1]!.matchAll(/(readOnly|notAllowed) as (\w+)/g)].map((x) => x[2]!),
    ),
  );
  return METHODS.filter(
    (m) => new RegExp(`export (const|async function|function) ${m}\\b`).test(src) && !stubbed.has(m),
  );
}

const toApiPath = (file: string) =>
  "/" +
  path
    .dirname(file)
    .replace(/^app\//, "")
    .replace(/\[([^\]]+)\]/g, "{$1}");

describe("OpenAPI document", () => {
  it("is a valid OpenAPI 3.1 document in every language", async () => {
    for (const locale of locales) {
      const doc = openApiDocument(
        translator(locale, "ApiReference") as unknown as (key: string) => string,
        "http://localhost:3000",
      );
      expect(doc.openapi).toBe("3.1.0");
      const result = await validate(structuredClone(doc) as never);
      expect(result.valid, result.valid ? "" : compileErrors(result)).toBe(true);
    }
  });

  it("lists exactly the public and token route files, with the methods each serves", () => {
    const files = routeFiles(path.join(process.cwd(), "app/api")).map((f) => path.relative(process.cwd(), f));
    const expected: Record<string, string[]> = {};
    for (const f of files) {
      const src = readFileSync(f, "utf8");
      const token = f.startsWith("app/api/v1/");
      const publicByDesign = /Public by design/.test(src) && !NOT_DESCRIBED.includes(f);
      if (token) expect(src, f).toMatch(/requireApiToken\(request, /);
      if (token || publicByDesign)
        expected[toApiPath(f)] = servedMethods(src)
          .map((m) => m.toLowerCase())
          .sort();
    }
    const doc = openApiDocument(english) as { paths: Record<string, Record<string, unknown>> };
    const described = Object.fromEntries(Object.entries(doc.paths).map(([p, ops]) => [p, Object.keys(ops).sort()]));
    expect(described).toEqual(expected);
    expect(Object.keys(expected)).toEqual(
      expect.arrayContaining(["/api/v1/events/{eventId}/sightings", "/api/health", "/api/openapi.json"]),
    );
  });

  it("marks every token endpoint as needing the bearer token, and no public one", () => {
    const doc = openApiDocument(english) as { paths: Record<string, Record<string, { security: unknown[] }>> };
    for (const [p, ops] of Object.entries(doc.paths)) {
      for (const op of Object.values(ops)) expect(op.security.length, p).toBe(p.startsWith("/api/v1/") ? 1 : 0);
    }
  });

  it("describes the sightings with the Darwin Core Archive's own terms, plus modified", () => {
    expect(Object.keys(dwcOccurrence.shape).sort()).toEqual([...DWC_TERMS, "modified"].sort());
  });
});
