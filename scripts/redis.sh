#!/usr/bin/env bash
# The project's own Redis (the evaluation queue): loopback only, data in $MW_DATA_DIR/redis.
#   scripts/redis.sh start   install Debian's redis-server (apt) when missing, start, wait for PONG
#   scripts/redis.sh stop    shut down (saving the append-only file)
#   scripts/redis.sh status  one line; exit 0 when it answers, 3 when it does not
# Port MW_REDIS_PORT (default 6407). With MW_REDIS_URL set, an existing Redis is used and this
# script starts nothing. Safe to run twice, concurrently (flock) and after a kill -9 (a stale pid
# file is cleared; the append-only file is replayed).
set -euo pipefail

ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/.." && pwd)"
PATH="/usr/sbin:/sbin:/usr/bin:$PATH"
# shellcheck source=scripts/lib.sh
source "$ROOT/scripts/lib.sh"

DATA_DIR="${MW_DATA_DIR:-.data}"
case "$DATA_DIR" in /*) ;; *) DATA_DIR="$ROOT/$DATA_DIR" ;; esac
REDIS_DIR="$DATA_DIR/redis"
PID_FILE="$REDIS_DIR/redis.pid"
LOG_FILE="$REDIS_DIR/redis.log"
LOCK_FILE="$DATA_DIR/redis.lock"
PORT="${MW_REDIS_PORT:-6407}"

say() { echo "redis.sh: $*"; }
die() { echo "redis.sh: $*" >&2; exit 1; }

ping_redis() {
  [[ "$(redis-cli -h 127.0.0.1 -p "$PORT" ping 2>/dev/null || true)" == PONG ]]
}

alive() {
  local pid="$1" state
  [[ -n "$pid" && -r "/proc/$pid/stat" ]] || return 1
  state="$(awk '{print $3}' "/proc/$pid/stat" 2>/dev/null || true)"
  [[ -n "$state" && "$state" != Z && "$state" != X ]]
}

port_in_use() {
  (exec 3<>"/dev/tcp/127.0.0.1/$PORT") 2>/dev/null
}

# The directory this port's server keeps its data in (empty when it is not ours or not Redis).
running_dir() {
  redis-cli -h 127.0.0.1 -p "$PORT" config get dir 2>/dev/null | sed -n 2p
}

start() {
  if [[ -n "${MW_REDIS_URL:-}" ]]; then
    say "MW_REDIS_URL is set: using that Redis, starting none"
    return
  fi
  ensure_redis_server
  mkdir -p "$REDIS_DIR"
  exec 9>"$LOCK_FILE"
  flock -w 60 9 || die "another redis.sh has held $LOCK_FILE for a minute; is it stuck?"

  if ping_redis; then
    local dir
    dir="$(running_dir)"
    if [[ -n "$dir" && "$dir" != "$REDIS_DIR" ]]; then
      die "port $PORT already serves the Redis of $dir, not $REDIS_DIR: set MW_REDIS_PORT to a free port (or MW_REDIS_URL to use that one)"
    fi
    say "Redis already running on 127.0.0.1:$PORT (data: $REDIS_DIR)"
    return
  fi
  local pid=""
  [[ -f "$PID_FILE" ]] && pid="$(cat "$PID_FILE" 2>/dev/null || true)"
  if [[ -n "$pid" ]] && ! alive "$pid"; then rm -f "$PID_FILE"; fi
  if port_in_use; then
    die "port $PORT on 127.0.0.1 is already taken by another program; set MW_REDIS_PORT to a free port"
  fi
  # Append-only persistence: an accepted job survives a restart of Redis.
  redis-server --port "$PORT" --bind 127.0.0.1 --protected-mode yes --dir "$REDIS_DIR" \
    --daemonize yes --pidfile "$PID_FILE" --logfile "$LOG_FILE" \
    --appendonly yes --appendfsync everysec --save '' --maxmemory-policy noeviction 9>&- ||
    die "redis-server did not start (log: $LOG_FILE)"
  local tries=0
  until ping_redis; do
    tries=$((tries + 1))
    if ((tries > 150)); then
      tail -n 15 "$LOG_FILE" >&2 2>/dev/null || true
      die "Redis did not answer within 30 s (log: $LOG_FILE)"
    fi
    sleep 0.2
  done
  say "Redis running on 127.0.0.1:$PORT (data: $REDIS_DIR)"
}

stop() {
  if [[ -n "${MW_REDIS_URL:-}" ]]; then
    say "MW_REDIS_URL is set: that Redis is not ours to stop"
    return
  fi
  mkdir -p "$REDIS_DIR"
  exec 9>"$LOCK_FILE"
  flock -w 60 9 || die "another redis.sh has held $LOCK_FILE for a minute; is it stuck?"
  if ! ping_redis; then
    rm -f "$PID_FILE"
    say "Redis is not running"
    return
  fi
  local dir
  dir="$(running_dir)"
  [[ "$dir" == "$REDIS_DIR" ]] || die "port $PORT serves the Redis of $dir, not ours ($REDIS_DIR)"
  redis-cli -h 127.0.0.1 -p "$PORT" shutdown >/dev/null 2>&1 || true
  local tries=0
  while ping_redis && ((tries < 100)); do
    sleep 0.1
    tries=$((tries + 1))
  done
  say "Redis stopped"
}

status() {
  if [[ -n "${MW_REDIS_URL:-}" ]]; then
    say "using MW_REDIS_URL"
    return
  fi
  if command -v redis-cli >/dev/null 2>&1 && ping_redis; then
    say "Redis running on 127.0.0.1:$PORT (data: $REDIS_DIR)"
  else
    say "Redis not running on 127.0.0.1:$PORT (data: $REDIS_DIR)"
    exit 3
  fi
}

case "${1:-}" in
  start) start ;;
  stop) stop ;;
  status) status ;;
  *) die "usage: scripts/redis.sh start|stop|status" ;;
esac
