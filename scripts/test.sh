#!/usr/bin/env bash
# One command from a fresh Debian 12 machine to every test: Debian packages (PostgreSQL,
# PostGIS, Chromium), npm packages, PostgreSQL on loopback, then lint (ESLint) and format
# (Prettier) checks at zero warnings, the type check, unit and
# integration tests (Vitest, on a fresh database), the production build and the browser
# tests (Playwright driving Debian's Chromium, on another fresh database).
# ECOTONE_TEST_SUFFIX, E2E_PORT and E2E_SMTP_PORT let two checkouts test side by side.
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"
cd "$ROOT"

ensure_system_packages chromium
ensure_node_modules
bash scripts/pg.sh start

log "Lint (ESLint, zero warnings) and format check (Prettier)"
npx eslint . --max-warnings=0
npx prettier --check . --log-level warn

log "Type check"
npx tsc --noEmit

log "Unit and integration tests"
# DATABASE_URL names the test database; the set-up migrates as ecotone, the app runs as ecotone_app.
DATABASE_URL="$(bash scripts/pg.sh owner-url "ecotone_test${ECOTONE_TEST_SUFFIX:-}")" npx vitest run

log "Production build"
npx next build >"$ROOT/.data/build-test.log" 2>&1 || { tail -40 "$ROOT/.data/build-test.log" >&2; die "next build failed"; }

log "Browser tests"
DATABASE_URL="$(bash scripts/pg.sh owner-url "ecotone_e2e${ECOTONE_TEST_SUFFIX:-}")" npx playwright test
log "All tests passed"
