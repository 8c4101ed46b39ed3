# Shared shell helpers for the set-up scripts. Sourced, not run.
set -euo pipefail
ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
export NEXT_TELEMETRY_DISABLED=1
PG_BIN=/usr/lib/postgresql/15/bin
PG_PORT="${ECOTONE_PG_PORT:-54329}"
PG_DATA="$ROOT/.data/postgres"

log() { printf '\033[1;32m[ecotone]\033[0m %s\n' "$*"; }
die() { printf '\033[1;31m[ecotone]\033[0m %s\n' "$*" >&2; exit 1; }

as_root() {
  if [ "$(id -u)" -eq 0 ]; then "$@"; elif command -v sudo >/dev/null; then sudo "$@"; else die "Need root (or sudo) to run: $*"; fi
}

# apt can be locked for minutes by another process: retry instead of failing.
apt_install() {
  local missing=("$@")
  log "Installing Debian packages: ${missing[*]}"
  local i
  for i in $(seq 1 30); do
    if as_root env DEBIAN_FRONTEND=noninteractive apt-get install -y -q "${missing[@]}" >/tmp/ecotone-apt.log 2>&1; then return 0; fi
    if grep -q "Unable to locate package\|has no installation candidate" /tmp/ecotone-apt.log; then
      as_root apt-get update -q >/dev/null 2>&1 || true
    fi
    log "apt-get busy or failed (try $i/30); retrying in 10 s"; sleep 10
  done
  cat /tmp/ecotone-apt.log >&2; die "apt-get install ${missing[*]} failed"
}

ensure_system_packages() {
  local want=() p
  [ -x "$PG_BIN/postgres" ] || want+=(postgresql-15)
  [ -f /usr/share/postgresql/15/extension/postgis.control ] || want+=(postgresql-15-postgis-3)
  for p in "$@"; do
    case "$p" in
      chromium) command -v chromium >/dev/null || [ -x /usr/bin/chromium ] || want+=(chromium) ;;
      *) dpkg -s "$p" >/dev/null 2>&1 || want+=("$p") ;;
    esac
  done
  if [ ${#want[@]} -gt 0 ]; then
    if [ ! -d /var/lib/apt/lists ] || [ -z "$(ls -A /var/lib/apt/lists 2>/dev/null | grep -v lock)" ]; then as_root apt-get update -q >/dev/null; fi
    apt_install "${want[@]}"
  fi
}

ensure_node_modules() {
  local stamp="$ROOT/node_modules/.ecotone-lock-hash" want
  want="$(sha256sum "$ROOT/package-lock.json" | cut -d' ' -f1)"
  if [ ! -f "$stamp" ] || [ "$(cat "$stamp")" != "$want" ]; then
    log "Installing npm packages (npm ci)"
    (cd "$ROOT" && npm ci --no-audit --no-fund --loglevel=error)
    echo "$want" >"$stamp"
  fi
}
