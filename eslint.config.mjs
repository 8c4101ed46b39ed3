// ESLint: the framework's own rules (eslint-config-next: React, React hooks and compiler
// checks, Next, accessibility, import, typescript-eslint recommended). Prettier owns layout;
// eslint-config-next 16.4 turns on no stylistic rule (checked against eslint-config-prettier
// 10.1's list: no overlap), so nothing here fights Prettier and that package is not needed.
// Run by scripts/test.sh at zero warnings (`npm run lint` = `eslint . --max-warnings=0`).
//
// File kinds: typescript-eslint's base block (inside eslint-config-next/typescript) has no
// `files`, so its parser reads every linted file: .ts/.tsx, the .mts scripts, tests and
// vitest.config.mts, the .mjs configs and the one .cjs preload script.
import { defineConfig, globalIgnores } from "eslint/config";
import nextVitals from "eslint-config-next/core-web-vitals";
import nextTs from "eslint-config-next/typescript";

export default defineConfig([
  globalIgnores([
    // Build output, tool state and reports (also in .gitignore).
    ".next/**",
    "out/**",
    "build/**",
    "coverage/**",
    "next-env.d.ts",
    ".data/**",
    "playwright-report/**",
    "test-results/**",
    // Written by scripts/build-sw.mjs after the build.
    "public/sw.js",
    "public/workbox-*.js",
    // Written by drizzle-kit.
    "db/migrations/meta/**",
  ]),
  ...nextVitals,
  ...nextTs,
  {
    // scripts/no-server-only.cjs is CommonJS on purpose (loaded with `tsx --require`), so
    // `require` is its only way to import.
    name: "ecotone/commonjs",
    files: ["**/*.cjs"],
    languageOptions: { sourceType: "commonjs" },
    rules: { "@typescript-eslint/no-require-imports": "off" },
  },
  {
    // Turned off for the browser tests: they are Playwright code, not React, and a Playwright
    // fixture hands its value on by calling its `use` callback, which the hooks rule takes for
    // React 19's `use()` ("called in function mail that is neither a component nor a hook").
    name: "ecotone/playwright",
    files: ["tests/e2e/**"],
    rules: { "react-hooks/rules-of-hooks": "off" },
  },
  {
    name: "ecotone/rules",
    rules: {
      // Adjusted: next/typescript sets this to "warn" with no exceptions. Zero warnings is the
      // bar, so it is an error here; a leading underscore marks a binding kept on purpose (a
      // positional parameter, an element skipped in array destructuring, a caught error not
      // read), and `...rest` siblings may drop fields (`const { secret: _s, ...safe } = row`).
      "@typescript-eslint/no-unused-vars": [
        "error",
        {
          argsIgnorePattern: "^_",
          varsIgnorePattern: "^_",
          caughtErrorsIgnorePattern: "^_",
          destructuredArrayIgnorePattern: "^_",
          ignoreRestSiblings: true,
        },
      ],
    },
  },
]);
