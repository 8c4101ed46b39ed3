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
# The app (server, mail worker, seed) connects as ecotone_app, which owns nothing; migrations
# run as the owner ecotone, then grant ecotone_app row access (db/roles.ts).
export DATABASE_URL="$(bash scripts/pg.sh url ecotone)"
export DATABASE_OWNER_URL="$(bash scripts/pg.sh owner-url ecotone)"
export APP_URL="${APP_URL:-http://localhost:3000}"
# The server runs in production mode, which refuses the demo's default AUTH_SECRET (lib/env.ts):
# unless one is given, make a random one once and keep it in .data/auth-secret, so that
# sessions and sign-in links survive a restart.
if [ -z "${AUTH_SECRET:-}" ]; then
  mkdir -p "$ROOT/.data"
  if [ ! -s "$ROOT/.data/auth-secret" ]; then
    (umask 077 && node -e 'console.log(require("node:crypto").randomBytes(32).toString("base64"))' >"$ROOT/.data/auth-secret")
  fi
  AUTH_SECRET="$(cat "$ROOT/.data/auth-secret")"
  export AUTH_SECRET
fi
npx tsx scripts/migrate.mts
# The data layer is marked "server-only"; scripts that use it preload scripts/no-server-only.cjs.
npx tsx --require ./scripts/no-server-only.cjs scripts/seed.mts

# The demo's e-mail: maildev catches every mail on 127.0.0.1:1025 and shows it at :1080.
if ! (exec 3<>/dev/tcp/127.0.0.1/1025) 2>/dev/null; then
  mkdir -p "$ROOT/.data/mail"
  setsid node node_modules/maildev/bin/maildev --ip 127.0.0.1 --web-ip 127.0.0.1 -s 1025 -w 1080 \
    --mail-directory "$ROOT/.data/mail" >"$ROOT/.data/maildev.log" 2>&1 < /dev/null &
  echo $! >"$ROOT/.data/maildev.pid"
  for _ in $(seq 1 50); do (exec 3<>/dev/tcp/127.0.0.1/1025) 2>/dev/null && break; sleep 0.2; done
fi
export SMTP_HOST=127.0.0.1 SMTP_PORT=1025 MAIL_INBOX_URL="http://localhost:1080"

# The mail worker beside the server: review decisions gathered into one digest per
# volunteer per hour, and the outbox drained with retries (log in .data/mail-worker.log).
if [ -f "$ROOT/.data/mail-worker.pid" ] && kill -0 "$(cat "$ROOT/.data/mail-worker.pid")" 2>/dev/null; then
  log "Mail worker already running (pid $(cat "$ROOT/.data/mail-worker.pid"))"
else
  setsid node_modules/.bin/tsx --require ./scripts/no-server-only.cjs scripts/mail-worker.mts >"$ROOT/.data/mail-worker.log" 2>&1 < /dev/null &
  echo $! >"$ROOT/.data/mail-worker.pid"
fi
# The photo store: the S3 fake (s3rver) on loopback, through the real S3 API, with files in
# .data/s3. S3_FAKE_PORT moves it; set S3_ENDPOINT (and keys, lib/env.ts) for a real store instead.
if [ -z "${S3_ENDPOINT:-}" ]; then
  S3_FAKE_PORT="${S3_FAKE_PORT:-9000}"
  if ! (exec 3<>/dev/tcp/127.0.0.1/"$S3_FAKE_PORT") 2>/dev/null; then
    S3_FAKE_PORT="$S3_FAKE_PORT" APP_URL="$APP_URL" setsid node_modules/.bin/tsx scripts/s3-fake.mts >"$ROOT/.data/s3-fake.log" 2>&1 < /dev/null &
    echo $! >"$ROOT/.data/s3-fake.pid"
    for _ in $(seq 1 150); do (exec 3<>/dev/tcp/127.0.0.1/"$S3_FAKE_PORT") 2>/dev/null && break; sleep 0.2; done
    (exec 3<>/dev/tcp/127.0.0.1/"$S3_FAKE_PORT") 2>/dev/null || die "The S3 fake did not start on port $S3_FAKE_PORT (see .data/s3-fake.log)"
  fi
  export S3_ENDPOINT="http://127.0.0.1:$S3_FAKE_PORT"
fi
# The base map: the tile fake draws PNG tiles of the demo's invented landscape on loopback
# (TILE_FAKE_PORT, default 9200). Set MAP_TILE_URL to a real tile server instead (lib/env.ts).
if [ -z "${MAP_TILE_URL:-}" ]; then
  TILE_FAKE_PORT="${TILE_FAKE_PORT:-9200}"
  if ! (exec 3<>/dev/tcp/127.0.0.1/"$TILE_FAKE_PORT") 2>/dev/null; then
    TILE_FAKE_PORT="$TILE_FAKE_PORT" setsid node_modules/.bin/tsx scripts/tile-fake.mts >"$ROOT/.data/tile-fake.log" 2>&1 < /dev/null &
    echo $! >"$ROOT/.data/tile-fake.pid"
    for _ in $(seq 1 150); do (exec 3<>/dev/tcp/127.0.0.1/"$TILE_FAKE_PORT") 2>/dev/null && break; sleep 0.2; done
    (exec 3<>/dev/tcp/127.0.0.1/"$TILE_FAKE_PORT") 2>/dev/null || die "The tile fake did not start on port $TILE_FAKE_PORT (see .data/tile-fake.log)"
  fi
  export MAP_TILE_URL="http://127.0.0.1:$TILE_FAKE_PORT/tiles/{z}/{x}/{y}.png"
fi
# Pages may send photos to, and show photos from, the photo store (Content-Security-Policy).
export CSP_EXTRA_ORIGINS="${CSP_EXTRA_ORIGINS:-$(node -e 'console.log(new URL(process.argv[1]).origin)' "${S3_PUBLIC_ENDPOINT:-$S3_ENDPOINT}")}"

log "Building the app (next build)"
npx next build >"$ROOT/.data/build.log" 2>&1 || { tail -40 "$ROOT/.data/build.log" >&2; die "next build failed (full log in .data/build.log)"; }

if (exec 3<>/dev/tcp/127.0.0.1/3000) 2>/dev/null; then
  die "Something already answers on port 3000. Stop it (or the earlier Ecotone server) and run this again."
fi
log "Ecotone is starting on http://localhost:3000  (stop with Ctrl-C; PostgreSQL keeps running: npm run db:stop)"
log "Demo e-mail inbox (sign-in links, invitations, review digests): http://localhost:1080"
log "Mail worker: .data/mail-worker.log (stop it with: kill \$(cat .data/mail-worker.pid))"
log "Demo sign-in addresses are listed in README.md (password: harrowmere-demo)"
exec node_modules/.bin/next start -H 127.0.0.1 -p 3000
