# shellcheck shell=bash
# Redis for scripts/services.sh. Sourced after lib.sh.
#
# One instance on 127.0.0.1:$EMFOLIO_REDIS_PORT (and EMFOLIO_BIND_ADDRESS when set, then with a
# password: .data/redis-secret, given to redis-server in a mode-600 file), append-only file in .data/redis
# so queued work survives a restart; no RDB snapshots. The demo uses logical
# db 0, tests use another db number on the same instance.

REDIS_DIR="$DATA_DIR/redis"
REDIS_PID="$RUN_DIR/redis.pid"
REDIS_LOG="$LOG_DIR/redis.log"

REDIS_CONF="$RUN_DIR/redis-auth.conf"

# redis_secret: the password Redis requires when it listens beyond loopback.
redis_secret() { stored_secret redis-secret; }

# redis_cli ARGS...: redis-cli on loopback, with the password when one is set.
redis_cli() {
  if bind_beyond_loopback; then
    REDISCLI_AUTH="$(redis_secret)" redis-cli -h 127.0.0.1 -p "$EMFOLIO_REDIS_PORT" "$@"
  else
    redis-cli -h 127.0.0.1 -p "$EMFOLIO_REDIS_PORT" "$@"
  fi
}

redis_probe() {
  [[ "$(redis_cli ping 2>/dev/null)" == "PONG" ]]
}

# redis_auth_args: the config file (first argument of redis-server) and bind list for this setting.
redis_auth_args() {
  if bind_beyond_loopback; then
    (umask 077 && printf 'requirepass %s\n' "$(redis_secret)" >"$REDIS_CONF")
    printf '%s\n' "$REDIS_CONF" --bind 127.0.0.1 "$EMFOLIO_BIND_ADDRESS"
  else
    printf '%s\n' --bind 127.0.0.1
  fi
}

redis_start() {
  if ! command -v redis-server >/dev/null 2>&1 || ! command -v redis-cli >/dev/null 2>&1; then
    say "redis: redis-server not found, installing redis-server"
    apt_install redis-server
  fi
  if redis_probe; then
    say "redis: already running on 127.0.0.1:$EMFOLIO_REDIS_PORT"
    return 0
  fi
  if tcp_open "$EMFOLIO_REDIS_PORT"; then
    die "redis: port $EMFOLIO_REDIS_PORT is taken by a process that does not answer PING (pid $(listener_pid "$EMFOLIO_REDIS_PORT")); set EMFOLIO_REDIS_PORT"
  fi
  mkdir -p "$REDIS_DIR"
  say "redis: starting on 127.0.0.1:$EMFOLIO_REDIS_PORT$(bind_beyond_loopback && printf ' and %s (password required)' "$EMFOLIO_BIND_ADDRESS")"
  # shellcheck disable=SC2094 # stdout only catches errors printed before daemonizing
  local auth_args
  mapfile -t auth_args < <(redis_auth_args)
  if ! redis-server "${auth_args[@]}" \
    --port "$EMFOLIO_REDIS_PORT" --protected-mode yes \
    --dir "$REDIS_DIR" --appendonly yes --appendfsync everysec --save '' \
    --daemonize yes --pidfile "$REDIS_PID" --logfile "$REDIS_LOG" \
    --maxmemory-policy noeviction >>"$REDIS_LOG" 2>&1 9>&-; then
    fail_start redis "$REDIS_LOG"
    return 1
  fi
  if ! wait_for "$START_TIMEOUT_DEFAULT" redis_probe; then
    fail_start redis "$REDIS_LOG"
    return 1
  fi
}

redis_stop() {
  if ! redis_probe; then
    say "redis: not running"
    rm -f "$REDIS_PID"
    return 0
  fi
  say "redis: stopping (SHUTDOWN; the append-only file is flushed)"
  redis_cli shutdown >/dev/null 2>&1 || true
  if ! wait_gone 30 redis_probe; then
    warn "redis: still answering after SHUTDOWN; see $(relpath "$REDIS_LOG")"
    return 1
  fi
  rm -f "$REDIS_PID"
}

redis_status_detail() {
  printf 'redis://127.0.0.1:%s/0 (tests: another db number)' "$EMFOLIO_REDIS_PORT"
}
