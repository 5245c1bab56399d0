#!/usr/bin/env bash
# The project's own MariaDB: loopback only, data in $MW_DATA_DIR/mariadb, no systemd.
#   scripts/db.sh start   install (apt) if missing, initialise once, start, create databases + user
#   scripts/db.sh stop    shut down cleanly
#   scripts/db.sh status  one line; exit 0 when it answers, 3 when it does not
# Safe to run twice, concurrently (flock) and after a kill -9 (stale socket and pid are cleared).
set -euo pipefail

ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
PATH="/usr/sbin:/sbin:$PATH"

DATA_DIR="${MW_DATA_DIR:-.data}"
case "$DATA_DIR" in /*) ;; *) DATA_DIR="$ROOT/$DATA_DIR" ;; esac
DB_DIR="$DATA_DIR/mariadb"
SOCK="$DB_DIR/mariadb.sock"
PID_FILE="$DB_DIR/mariadb.pid"
LOG_FILE="$DB_DIR/mariadb.err"
LOCK_FILE="$DATA_DIR/mariadb.lock"
MARKER="$DB_DIR/.modewright-initialised"
PORT="${MW_DB_PORT:-3407}"
APP_USER="${MW_DB_USER:-modewright}"
APP_PASSWORD="${MW_DB_PASSWORD:-modewright-local}"
DB_NAMES=(modewright modewright_test)
if [[ -n "${MW_DB_NAME:-}" && "${MW_DB_NAME}" != modewright && "${MW_DB_NAME}" != modewright_test ]]; then
  DB_NAMES+=("$MW_DB_NAME")
fi

say() { echo "db.sh: $*"; }
die() { echo "db.sh: $*" >&2; exit 1; }

ping_db() {
  mariadb-admin --no-defaults --socket="$SOCK" --user=root --connect-timeout=2 ping >/dev/null 2>&1
}

port_in_use() {
  (exec 3<>"/dev/tcp/127.0.0.1/$PORT") 2>/dev/null
}

# A process counts as alive only when /proc says so and it is not a zombie (kill -0 is not proof).
alive() {
  local pid="$1" state
  [[ -n "$pid" && -r "/proc/$pid/stat" ]] || return 1
  state="$(awk '{print $3}' "/proc/$pid/stat" 2>/dev/null || true)"
  [[ -n "$state" && "$state" != Z && "$state" != X ]]
}

ensure_installed() {
  if command -v mariadbd >/dev/null 2>&1 && command -v mariadb-install-db >/dev/null 2>&1; then
    return
  fi
  say "mariadbd not found; installing Debian's mariadb-server with apt (about a minute)"
  local sudo=()
  if [[ "$(id -u)" != 0 ]]; then
    command -v sudo >/dev/null 2>&1 || die "mariadb-server is missing and we are not root; install it with: apt-get install mariadb-server"
    sudo=(sudo -n)
  fi
  "${sudo[@]}" apt-get update -qq >/dev/null || die "apt-get update failed; cannot install mariadb-server"
  DEBIAN_FRONTEND=noninteractive "${sudo[@]}" apt-get install -y -qq mariadb-server mariadb-client \
    >/dev/null || die "apt-get install mariadb-server failed"
  hash -r
  command -v mariadbd >/dev/null 2>&1 || die "apt installed mariadb-server but mariadbd is still not on PATH"
}

user_args() {
  if [[ "$(id -u)" == 0 ]]; then echo "--user=root"; fi
}

initialise() {
  if [[ -f "$MARKER" ]]; then return; fi
  # No marker: either a fresh clone or an initialisation that was interrupted. Start over.
  # An existing directory is moved aside, never deleted: it may still hold someone's data.
  if [[ -d "$DB_DIR" ]] && [[ -n "$(ls -A "$DB_DIR" 2>/dev/null)" ]]; then
    local aside
    aside="$DB_DIR.unfinished-$(date -u +%Y%m%dT%H%M%SZ)"
    say "found an unfinished data directory; moved it to $aside and initialising afresh"
    mv "$DB_DIR" "$aside"
  fi
  mkdir -p "$DB_DIR"
  # shellcheck disable=SC2046
  mariadb-install-db --no-defaults --datadir="$DB_DIR" $(user_args) \
    --auth-root-authentication-method=normal --skip-test-db --skip-name-resolve \
    >"$DB_DIR/install.log" 2>&1 9>&- || {
    tail -n 20 "$DB_DIR/install.log" >&2
    die "mariadb-install-db failed (log: $DB_DIR/install.log)"
  }
}

clear_stale() {
  local pid=""
  [[ -f "$PID_FILE" ]] && pid="$(cat "$PID_FILE" 2>/dev/null || true)"
  if [[ -n "$pid" ]] && alive "$pid"; then
    return 0
  fi
  rm -f "$PID_FILE" "$SOCK" "$SOCK.lock"
  return 1
}

wait_for_ping() {
  local server_pid="$1" tries=0
  until ping_db; do
    tries=$((tries + 1))
    if [[ -n "$server_pid" ]] && ! alive "$server_pid"; then
      tail -n 15 "$LOG_FILE" >&2 2>/dev/null || true
      die "MariaDB stopped during start-up (log: $LOG_FILE)"
    fi
    if ((tries > 300)); then
      die "MariaDB did not answer within 60 s (log: $LOG_FILE)"
    fi
    sleep 0.2
  done
}

bootstrap_sql() {
  local sql="" db
  for db in "${DB_NAMES[@]}"; do
    sql+="CREATE DATABASE IF NOT EXISTS \`$db\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;"
  done
  sql+="DROP USER IF EXISTS ''@'localhost';"
  for host in localhost 127.0.0.1; do
    sql+="CREATE USER IF NOT EXISTS '$APP_USER'@'$host' IDENTIFIED BY '$APP_PASSWORD';"
    sql+="ALTER USER '$APP_USER'@'$host' IDENTIFIED BY '$APP_PASSWORD';"
    for db in "${DB_NAMES[@]}"; do
      sql+="GRANT ALL PRIVILEGES ON \`$db\`.* TO '$APP_USER'@'$host';"
    done
  done
  sql+="FLUSH PRIVILEGES;"
  mariadb --no-defaults --socket="$SOCK" --user=root -e "$sql"
}

start() {
  ensure_installed
  # A Unix socket path is limited to 107 bytes.
  if ((${#SOCK} > 100)); then
    die "the data directory path is too long for MariaDB's socket ($SOCK); set MW_DATA_DIR to a shorter path"
  fi
  mkdir -p "$DATA_DIR"
  exec 9>"$LOCK_FILE"
  flock -w 120 9 || die "another db.sh has held $LOCK_FILE for 2 minutes; is it stuck?"

  if ping_db; then
    # One data directory has one server: if it listens on another port, say so rather than
    # report success on a port where nothing answers.
    local running
    running="$(mariadb --no-defaults --socket="$SOCK" --user=root -N -B -e 'SELECT @@port' 2>/dev/null || true)"
    if [[ -n "$running" && "$running" != "$PORT" ]]; then
      die "the MariaDB of $DB_DIR is already running on 127.0.0.1:$running, not $PORT: stop it with 'MW_DB_PORT=$running npm run db:stop', or use MW_DB_PORT=$running (or another MW_DATA_DIR)"
    fi
    bootstrap_sql
    touch "$MARKER"
    say "MariaDB already running on 127.0.0.1:$PORT (data: $DB_DIR)"
    return
  fi

  if clear_stale; then
    # A live server without an answering socket yet: it is still starting (or recovering).
    wait_for_ping "$(cat "$PID_FILE")"
    bootstrap_sql
    touch "$MARKER"
    say "MariaDB running on 127.0.0.1:$PORT (data: $DB_DIR)"
    return
  fi

  if port_in_use; then
    die "port $PORT on 127.0.0.1 is already taken by another program; set MW_DB_PORT to a free port"
  fi

  initialise
  # shellcheck disable=SC2046
  setsid mariadbd --no-defaults --datadir="$DB_DIR" --socket="$SOCK" --pid-file="$PID_FILE" \
    --log-error="$LOG_FILE" --port="$PORT" --bind-address=127.0.0.1 --skip-name-resolve \
    --character-set-server=utf8mb4 --collation-server=utf8mb4_unicode_ci \
    --default-time-zone=+00:00 --innodb-buffer-pool-size=64M --max-connections=200 \
    $(user_args) </dev/null >>"$DB_DIR/mariadbd.out" 2>&1 9>&- &
  local server_pid=$!
  wait_for_ping "$server_pid"
  bootstrap_sql
  touch "$MARKER"
  say "MariaDB running on 127.0.0.1:$PORT (data: $DB_DIR)"
}

stop() {
  mkdir -p "$DATA_DIR"
  exec 9>"$LOCK_FILE"
  flock -w 120 9 || die "another db.sh has held $LOCK_FILE for 2 minutes; is it stuck?"
  if ! ping_db; then
    clear_stale || true
    say "MariaDB is not running"
    return
  fi
  local pid=""
  [[ -f "$PID_FILE" ]] && pid="$(cat "$PID_FILE" 2>/dev/null || true)"
  mariadb-admin --no-defaults --socket="$SOCK" --user=root shutdown
  local tries=0
  while [[ -n "$pid" ]] && alive "$pid" && ((tries < 150)); do
    sleep 0.2
    tries=$((tries + 1))
  done
  say "MariaDB stopped"
}

status() {
  if ping_db; then
    say "MariaDB running on 127.0.0.1:$PORT (data: $DB_DIR)"
  else
    say "MariaDB not running (data: $DB_DIR)"
    exit 3
  fi
}

case "${1:-}" in
  start) start ;;
  stop) stop ;;
  status) status ;;
  *) die "usage: scripts/db.sh start|stop|status" ;;
esac
