import { readdirSync, readFileSync, statSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { ROUTES } from "../e2e/route-table";

// No handler is left out of the role matrix by accident: every exported method of every
// route file must have a row in tests/e2e/route-table.ts, and every row a real handler.
function routeFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const full = path.join(dir, name);
    if (statSync(full).isDirectory()) return routeFiles(full);
    return name === "route.ts" ? [full] : [];
  });
}

const METHODS = ["GET", "POST", "PUT", "PATCH", "DELETE"] as const;

function exportedMethods(file: string): string[] {
  const src = readFileSync(file, "utf8");
  return METHODS.filter(
    (m) =>
      new RegExp(`export (const|async function|function) ${m}\\b`).test(src) ||
      new RegExp(`export \\{[^}]*\\b(as )?${m}\\b[^}]*\\}`).test(src),
  );
}

describe("route table", () => {
  const files = routeFiles(path.join(process.cwd(), "app/api")).map((f) => path.relative(process.cwd(), f));

  it("lists every exported handler of every route file", () => {
    const missing = files.flatMap((f) =>
      exportedMethods(f)
        .filter((m) => !ROUTES.some((r) => r.file === f && r.method === m))
        .map((m) => `${m} ${f}`),
    );
    expect(missing).toEqual([]);
  });

  it("names only handlers that exist", () => {
    const stale = ROUTES.filter((r) => !files.includes(r.file) || !exportedMethods(r.file).includes(r.method)).map(
      (r) => `${r.method} ${r.file}`,
    );
    expect(stale).toEqual([]);
  });

  it("checks a session in every handler that is not public by design", () => {
    for (const f of files) {
      const src = readFileSync(f, "utf8");
      const publicByDesign = /Public by design/.test(src) || f.includes("[...path]");
      if (!publicByDesign)
        expect(src, f).toMatch(/require(User|Admin|EventRole|OrganisationOrganiser|ApiToken|SiteAdmin|\w+Permit)\(/);
    }
  });
});
