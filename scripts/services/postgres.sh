# shellcheck shell=bash
# PostgreSQL for scripts/services.sh. Sourced after lib.sh.
#
# Cluster: .data/postgres (owned by the `postgres` OS user, mode 700), listening
# on 127.0.0.1:$EMFOLIO_PG_PORT (and EMFOLIO_BIND_ADDRESS, admitting EMFOLIO_CLIENT_CIDR, when set), unix socket in /tmp/emfolio-pg-<port>
# (short path, reachable by the postgres user wherever the checkout lives).
# Auth: TCP (127.0.0.1) uses scram-sha-256; app role emfolio / emfolio owns the
# databases `emfolio` (demo) and `emfolio_test` (tests). The `postgres`
# superuser has no password and is reachable only over the unix socket by the
# postgres OS user (peer auth): runuser -u postgres -- psql -h /tmp/emfolio-pg-<port> -p <port>

PG_USER_NAME=emfolio
PG_USER_PASSWORD=emfolio
PG_DATABASES=(emfolio emfolio_test)
PG_SOCKET_DIR="/tmp/emfolio-pg-$EMFOLIO_PG_PORT"
PG_LINK="$DATA_DIR/postgres"
PG_LOG="$LOG_DIR/postgres.log"

as_postgres() {
  runuser -u postgres -- "$@"
}

# The postgres user needs to traverse every folder down to .data. When the
# checkout lives somewhere it can't (e.g. under /root, mode 700), the cluster
# goes to /var/lib/emfolio/<hash of the checkout path>/ and .data/postgres and
# .data/log/postgres.log become symlinks to it.
pg_resolve_paths() {
  if [[ -L "$PG_LINK" ]]; then
    PG_DATA="$(readlink -f "$PG_LINK")"
    PG_LOG_REAL="$(dirname "$PG_DATA")/postgres.log"
    return
  fi
  if [[ -d "$PG_LINK" ]] || as_postgres test -x "$DATA_DIR" 2>/dev/null; then
    PG_DATA="$PG_LINK"
    PG_LOG_REAL="$PG_LOG"
    return
  fi
  local base key="$PROJECT_ROOT"
  # A second set of services (EMFOLIO_DATA_DIR) gets its own cluster folder.
  [[ "$DATA_DIR" == "$PROJECT_ROOT/.data" ]] || key="$DATA_DIR"
  base="/var/lib/emfolio/$(printf '%s' "$key" | sha1sum | cut -c1-12)"
  say "postgres: user postgres cannot reach $DATA_DIR; keeping the cluster in $base (symlinked from .data)"
  mkdir -p "$base/data"
  chown postgres:postgres "$base" "$base/data"
  chmod 700 "$base/data"
  ln -sfn "$base/data" "$PG_LINK"
  touch "$base/postgres.log"
  chown postgres:postgres "$base/postgres.log"
  ln -sfn "$base/postgres.log" "$PG_LOG"
  PG_DATA="$base/data"
  PG_LOG_REAL="$base/postgres.log"
}

# Pick the binaries: the cluster's major version if initialised, else the newest.
pg_bin_dir() {
  local want="" dir
  if [[ -n "${PG_DATA:-}" && -f "$PG_DATA/PG_VERSION" ]]; then
    want="$(cat "$PG_DATA/PG_VERSION")"
    dir="/usr/lib/postgresql/$want/bin"
    [[ -x "$dir/pg_ctl" ]] || die "postgres: cluster in $(relpath "$PG_DATA") is version $want but $dir/pg_ctl is missing (apt-get install postgresql-$want)"
    printf '%s' "$dir"
    return
  fi
  dir="$(find /usr/lib/postgresql -mindepth 3 -maxdepth 3 -path '*/bin/pg_ctl' 2>/dev/null | sort -V | tail -n 1)"
  [[ -n "$dir" ]] || return 1
  dirname "$dir"
}

pg_ensure_installed() {
  if ! compgen -G '/usr/lib/postgresql/*/bin/pg_ctl' >/dev/null; then
    say "postgres: pg_ctl not found, installing postgresql"
    apt_install postgresql
  fi
}

pg_probe() {
  pg_isready -q -h 127.0.0.1 -p "$EMFOLIO_PG_PORT" -t 2
}

# The postmaster of this cluster is running (a crashed one that is still a
# zombie, or whose pid file is stale, is not).
pg_running() {
  local pid
  [[ -f "$PG_DATA/PG_VERSION" && -f "$PG_DATA/postmaster.pid" ]] || return 1
  pid="$(head -n 1 "$PG_DATA/postmaster.pid" | tr -dc '0-9')"
  proc_alive "$pid"
}

# After a crash, wait for the dead postmaster and its children to be reaped so
# that the new one's lock-file and shared-memory checks pass.
pg_wait_reaped() {
  local pid
  [[ -f "$PG_DATA/postmaster.pid" ]] || return 0
  pid="$(head -n 1 "$PG_DATA/postmaster.pid" | tr -dc '0-9')"
  [[ -n "$pid" ]] || return 0
  if proc_exists "$pid"; then
    say "postgres: waiting for the previous postmaster (pid $pid) to be reaped"
    wait_gone 20 proc_exists "$pid" || true
  fi
}

pg_initdb() {
  local bin="$1"
  say "postgres: initdb $(relpath "$PG_LINK")"
  mkdir -p "$PG_DATA"
  chown postgres:postgres "$PG_DATA"
  chmod 700 "$PG_DATA"
  (cd / && as_postgres "$bin/initdb" -D "$PG_DATA" -U postgres -E UTF8 --locale=C.UTF-8 \
    --auth-local=peer --auth-host=scram-sha-256 --no-instructions) >>"$PG_LOG_REAL" 2>&1 ||
    fail_start postgres "$PG_LOG" || exit 1
  cat >>"$PG_DATA/postgresql.conf" <<'EOF'

# ---- emfolio (scripts/services/postgres.sh) ----
# Port and socket directory are passed on the command line by pg_ctl -o.
listen_addresses = '127.0.0.1'
password_encryption = 'scram-sha-256'
max_connections = 100
log_min_duration_statement = 1000
EOF
}

pg_psql() {
  (cd / && as_postgres psql -X -q -A -t -v ON_ERROR_STOP=1 -h "$PG_SOCKET_DIR" -p "$EMFOLIO_PG_PORT" -d postgres "$@")
}

pg_provision() {
  pg_psql -c "DO \$\$ BEGIN
      IF NOT EXISTS (SELECT FROM pg_roles WHERE rolname = '$PG_USER_NAME') THEN
        CREATE ROLE $PG_USER_NAME LOGIN CREATEDB PASSWORD '$PG_USER_PASSWORD';
      END IF;
    END \$\$;" || return 1
  local db
  for db in "${PG_DATABASES[@]}"; do
    if [[ "$(pg_psql -c "SELECT 1 FROM pg_database WHERE datname = '$db'")" != "1" ]]; then
      say "postgres: creating database $db (owner $PG_USER_NAME)"
      pg_psql -c "CREATE DATABASE $db OWNER $PG_USER_NAME" || return 1
    fi
  done
}

# The addresses to listen on: loopback, plus EMFOLIO_BIND_ADDRESS when set (lib.sh).
pg_listen_addresses() {
  if bind_beyond_loopback; then printf '127.0.0.1,%s' "$EMFOLIO_BIND_ADDRESS"; else printf '127.0.0.1'; fi
}

# Keeps one marked pg_hba.conf line admitting EMFOLIO_CLIENT_CIDR (scram-sha-256) while the cluster
# listens beyond loopback, and none otherwise.
pg_sync_hba() {
  local hba="$PG_DATA/pg_hba.conf" marker="# emfolio: clients on other hosts (EMFOLIO_CLIENT_CIDR)"
  [[ -f "$hba" ]] || return 0
  as_postgres sed -i "/^host all all .* scram-sha-256 $marker\$/d" "$hba"
  if bind_beyond_loopback; then
    printf 'host all all %s scram-sha-256 %s\n' "$EMFOLIO_CLIENT_CIDR" "$marker" | as_postgres tee -a "$hba" >/dev/null
  fi
}

# shellcheck disable=SC2094 # pg_ctl messages and the server log share one file
pg_ctl_start() {
  (cd / && as_postgres "$1/pg_ctl" -D "$PG_DATA" -l "$PG_LOG_REAL" -w -t "$START_TIMEOUT_PG" \
    -o "-h $(pg_listen_addresses) -p $EMFOLIO_PG_PORT -k $PG_SOCKET_DIR" start) >>"$PG_LOG_REAL" 2>&1 9>&-
}

pg_start() {
  pg_ensure_installed
  pg_resolve_paths
  local bin
  bin="$(pg_bin_dir)" || die "postgres: no pg_ctl under /usr/lib/postgresql/*/bin"

  mkdir -p "$PG_SOCKET_DIR"
  chown postgres:postgres "$PG_SOCKET_DIR"
  chmod 755 "$PG_SOCKET_DIR"
  touch "$PG_LOG_REAL"
  chown postgres:postgres "$PG_LOG_REAL"

  if pg_running; then
    if pg_probe; then
      say "postgres: already running on 127.0.0.1:$EMFOLIO_PG_PORT"
      pg_provision || die "postgres: could not create role/databases; see $(relpath "$PG_LOG")"
      return 0
    fi
    die "postgres: the cluster in $(relpath "$PG_LINK") is running but does not answer on port $EMFOLIO_PG_PORT (started with another EMFOLIO_PG_PORT?); run 'scripts/services.sh stop postgres' with that port"
  fi
  if tcp_open "$EMFOLIO_PG_PORT"; then
    die "postgres: port $EMFOLIO_PG_PORT is already taken by another process (pid $(listener_pid "$EMFOLIO_PG_PORT")); set EMFOLIO_PG_PORT"
  fi

  if [[ ! -f "$PG_DATA/PG_VERSION" ]]; then
    pg_initdb "$bin"
  fi
  pg_wait_reaped
  pg_sync_hba
  # A crash can leave a stale postmaster.pid; pg_ctl handles that itself.
  say "postgres: starting on $(pg_listen_addresses) port $EMFOLIO_PG_PORT"
  if ! pg_ctl_start "$bin"; then
    # After a crash the old backends may still hold the shared memory for a moment.
    say "postgres: first start attempt failed, retrying in 3 s"
    sleep 3
    if ! pg_ctl_start "$bin"; then
      fail_start postgres "$PG_LOG"
      return 1
    fi
  fi
  if ! wait_for "$START_TIMEOUT_PG" pg_probe; then
    fail_start postgres "$PG_LOG"
    return 1
  fi
  pg_provision || die "postgres: could not create role/databases; see $(relpath "$PG_LOG")"
}

pg_stop() {
  if [[ ! -e "$PG_LINK" ]]; then
    say "postgres: not running (no cluster yet)"
    return 0
  fi
  pg_resolve_paths
  if ! pg_running; then
    say "postgres: not running"
    return 0
  fi
  local bin
  bin="$(pg_bin_dir)"
  say "postgres: stopping"
  (cd / && as_postgres "$bin/pg_ctl" -D "$PG_DATA" stop -m fast -w -t 60) >/dev/null
}

pg_status_detail() {
  printf 'postgresql://%s:%s@127.0.0.1:%s/{%s}' "$PG_USER_NAME" "$PG_USER_PASSWORD" "$EMFOLIO_PG_PORT" \
    "$(IFS=,; printf '%s' "${PG_DATABASES[*]}")"
}
