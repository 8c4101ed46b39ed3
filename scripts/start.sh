#!/usr/bin/env bash
# One command from a fresh Debian 12 machine (Node.js 20 + npm, as root or with sudo) to
# the demo on http://localhost:3000: Debian packages, npm packages, PostgreSQL + PostGIS
# on loopback, migrations, the demo data, a production build, then the server.
# Safe to run again: every step reuses what is already there.
source "$(dirname "${BASH_SOURCE[0]}")/lib.sh"
cd "$ROOT"

ensure_system_packages
ensure_node_modules
bash scripts/pg.sh start
bash scripts/pg.sh ensure-db ecotone
export DATABASE_URL="$(bash scripts/pg.sh url ecotone)"
export APP_URL="${APP_URL:-http://localhost:3000}"
npx tsx scripts/migrate.mts
npx tsx scripts/seed.mts

log "Building the app (next build)"
npx next build >"$ROOT/.data/build.log" 2>&1 || { tail -40 "$ROOT/.data/build.log" >&2; die "next build failed (full log in .data/build.log)"; }

if (exec 3<>/dev/tcp/127.0.0.1/3000) 2>/dev/null; then
  die "Something already answers on port 3000. Stop it (or the earlier Ecotone server) and run this again."
fi
log "Ecotone is starting on http://localhost:3000  (stop with Ctrl-C; PostgreSQL keeps running: npm run db:stop)"
log "Demo sign-in addresses are listed in README.md"
exec node_modules/.bin/next start -H 127.0.0.1 -p 3000
