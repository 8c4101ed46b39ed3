import { existsSync, readdirSync, readFileSync, statSync } from "node:fs";
import path from "node:path";
import ts from "typescript";
import { describe, expect, it } from "vitest";

// Walks every source file's imports with the TypeScript compiler's own scanner and checks
// that the arrows run one way: app → components → server → db → lib, never back.

const root = path.resolve(__dirname, "../..");
const skipped = new Set(["node_modules", ".next", ".data", ".git", "test-results", "playwright-report"]);
const sourceExtensions = [".ts", ".tsx", ".mts", ".cts"];

// Tests are not part of the layering (a lib/ test may build its data with the demo seed or
// sharp); they are skipped here and nothing imports them.
const isTest = (name: string) => /\.(test|spec)\.tsx?$/.test(name);

function sourceFiles(dir: string): string[] {
  const found: string[] = [];
  for (const name of readdirSync(dir)) {
    if (skipped.has(name) || isTest(name)) continue;
    const full = path.join(dir, name);
    if (statSync(full).isDirectory()) found.push(...sourceFiles(full));
    else if (sourceExtensions.some((ext) => name.endsWith(ext))) found.push(full);
  }
  return found;
}

/** The project folder a specifier points into ("lib", "db", ...), or the package name; null for node built-ins. */
function target(fromFile: string, specifier: string): { folder: string } | { pkg: string } | null {
  if (specifier.startsWith("node:")) return null;
  let resolved: string | undefined;
  if (specifier.startsWith("@/")) resolved = path.join(root, specifier.slice(2));
  else if (specifier.startsWith(".")) resolved = path.resolve(path.dirname(fromFile), specifier);
  if (resolved === undefined) {
    const parts = specifier.split("/");
    return { pkg: specifier.startsWith("@") ? parts.slice(0, 2).join("/") : parts[0]! };
  }
  const relative = path.relative(root, resolved);
  return { folder: relative.split(path.sep)[0]! };
}

type Rule = { from: string; folders?: string[]; packages?: RegExp; why: string };

const rules: Rule[] = [
  {
    from: "lib",
    folders: ["app", "db", "server", "components"],
    why: "lib/ runs anywhere: it imports only lib/ and pure packages",
  },
  // Packages that need a server (or its secrets); next-intl stays allowed for lib/i18n.
  {
    from: "lib",
    packages:
      /^(next-auth|@auth\/.*|nodemailer|sharp|@aws-sdk\/.*|pg|postgres|drizzle-orm|drizzle-kit|server-only|bcryptjs|s3rver)$/,
    why: "lib/ runs anywhere: no server-only packages",
  },
  { from: "db", folders: ["app", "server", "components"], why: "db/ is the data layer: it imports only db/ and lib/" },
  { from: "server", folders: ["app", "components"], why: "server/ services do not depend on pages, handlers or UI" },
  { from: "components", folders: ["app"], why: "components/ do not depend on pages or handlers" },
];

type Offence = { file: string; specifier: string; why: string };

function offences(): Offence[] {
  const found: Offence[] = [];
  for (const file of sourceFiles(root)) {
    const folder = path.relative(root, file).split(path.sep)[0]!;
    const applicable = rules.filter((rule) => rule.from === folder);
    if (applicable.length === 0) continue;
    const info = ts.preProcessFile(readFileSync(file, "utf8"), true, true);
    for (const { fileName: specifier } of info.importedFiles) {
      const to = target(file, specifier);
      if (to === null) continue;
      for (const rule of applicable) {
        const bad = "folder" in to ? rule.folders?.includes(to.folder) : rule.packages?.test(to.pkg);
        if (bad) found.push({ file: path.relative(root, file), specifier, why: rule.why });
      }
    }
  }
  return found;
}

describe("import rules", () => {
  it("finds the source folders it checks", () => {
    for (const folder of ["app", "components", "db", "lib", "server"])
      expect(existsSync(path.join(root, folder))).toBe(true);
    expect(sourceFiles(path.join(root, "lib")).length).toBeGreaterThan(20);
  });

  it("resolves '@/…' and relative specifiers to the folder they point into", () => {
    expect(target(path.join(root, "lib/field/sync.ts"), "@/db/queries/pack")).toEqual({ folder: "db" });
    expect(target(path.join(root, "lib/field/sync.ts"), "../../app/api/x/schema")).toEqual({ folder: "app" });
    expect(target(path.join(root, "db/queries/x.ts"), "../schema")).toEqual({ folder: "db" });
    expect(target(path.join(root, "lib/x.ts"), "@aws-sdk/client-s3")).toEqual({ pkg: "@aws-sdk/client-s3" });
    expect(target(path.join(root, "lib/x.ts"), "node:crypto")).toBeNull();
  });

  it("has no import that runs against the layering", () => {
    const found = offences();
    const listing = found.map((o) => `${o.file} imports "${o.specifier}" (${o.why})`).join("\n");
    expect(listing, `imports against the layering:\n${listing}`).toBe("");
  });
});
