# Shared set-up steps for scripts/start.sh, scripts/dev.sh and scripts/test.sh.
# Each step does nothing when its work is already done, so the scripts are safe to re-run.

ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"

log() { printf '\033[1m[modewright]\033[0m %s\n' "$*"; }

as_root() {
  if [ "$(id -u)" = 0 ]; then "$@"; elif command -v sudo >/dev/null; then sudo "$@"; else
    echo "[modewright] need root to run: $*" >&2; return 1; fi
}

# npm packages: install when node_modules is missing or older than the lockfile.
ensure_npm_packages() {
  if [ ! -f "$ROOT/node_modules/.package-lock.json" ] ||
    [ "$ROOT/package-lock.json" -nt "$ROOT/node_modules/.package-lock.json" ]; then
    log "installing npm packages (npm ci)"
    (cd "$ROOT" && npm ci --no-audit --no-fund)
  fi
}

# Debian packages: one apt run for everything missing (MariaDB always; Redis unless MW_REDIS_URL
# points at an existing one; Chromium when asked, with poppler-utils, whose pdftotext and pdfinfo
# let the print and package tests read the pages Chromium prints).
ensure_debian_packages() {
  local want=()
  command -v mariadbd >/dev/null 2>&1 || [ -x /usr/sbin/mariadbd ] || want+=(mariadb-server)
  if [ -z "${MW_REDIS_URL:-}" ] && ! command -v redis-server >/dev/null 2>&1; then
    want+=(redis-server)
  fi
  if [ "${1:-}" = with-chromium ] && [ ! -x /usr/bin/chromium ]; then want+=(chromium); fi
  # The package PDF's browser test reads page counts and text with poppler's pdfinfo/pdftotext.
  if [ "${1:-}" = with-chromium ] && ! command -v pdftotext >/dev/null 2>&1; then
    want+=(poppler-utils)
  fi
  if [ ${#want[@]} -gt 0 ]; then
    log "installing Debian packages: ${want[*]}"
    as_root apt-get update -qq
    as_root env DEBIAN_FRONTEND=noninteractive apt-get install -y -qq "${want[@]}" >/dev/null
  fi
}

# Debian's redis-server alone (scripts/redis.sh). Its install may start a system instance on 6379;
# the project never uses that one.
ensure_redis_server() {
  command -v redis-server >/dev/null 2>&1 && command -v redis-cli >/dev/null 2>&1 && return 0
  log "installing Debian packages: redis-server"
  as_root apt-get update -qq
  as_root env DEBIAN_FRONTEND=noninteractive apt-get install -y -qq redis-server >/dev/null
  hash -r
  command -v redis-server >/dev/null 2>&1 || { echo "[modewright] redis-server did not install" >&2; return 1; }
}
