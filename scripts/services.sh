#!/usr/bin/env bash
# Local services for Emfolio, no Docker: PostgreSQL, Redis, an S3 fake (s3rver),
# an SMTP fake and an uploadthing fake, all on 127.0.0.1 with data under .data/ (git-ignored);
# EMFOLIO_BIND_ADDRESS (with EMFOLIO_CLIENT_CIDR) adds an address for clients on other hosts.
#
#   bash scripts/services.sh start|stop|status|restart [postgres|redis|s3|smtp|uploadthing]
#   bash scripts/services.sh env      # connection settings for a .env
#   bash scripts/services.sh verify   # S3 stream round trip, presigned PUT, CORS, a test mail
#   npm run services -- start
#
# Ports (env overrides): EMFOLIO_PG_PORT=54329 EMFOLIO_REDIS_PORT=63799
# EMFOLIO_S3_PORT=45690 EMFOLIO_SMTP_PORT=2529 EMFOLIO_UPLOADTHING_PORT=45700; the bind address
# EMFOLIO_BIND_ADDRESS=127.0.0.1 and EMFOLIO_CLIENT_CIDR (scripts/services/lib.sh). Nothing else is read from the
# environment; the app's .env is not needed. See scripts/services/README.md.
set -euo pipefail

# shellcheck source=scripts/services/lib.sh
source "$(dirname "${BASH_SOURCE[0]}")/services/lib.sh"
# shellcheck source=scripts/services/postgres.sh
source "$SERVICES_DIR/postgres.sh"
# shellcheck source=scripts/services/redis.sh
source "$SERVICES_DIR/redis.sh"
# shellcheck source=scripts/services/node-fakes.sh
source "$SERVICES_DIR/node-fakes.sh"

usage() {
  cat >&2 <<USAGE
usage: bash scripts/services.sh start|stop|status|restart [name]
       bash scripts/services.sh env|verify
names: ${ALL_SERVICES[*]}
USAGE
  exit 2
}

svc_fn() { # svc_fn NAME ACTION -> function name
  case "$1" in
    postgres) printf 'pg_%s' "$2" ;;
    redis | s3 | smtp) printf '%s_%s' "$1" "$2" ;;
    uploadthing) printf 'ut_%s' "$2" ;;
    *) die "unknown service '$1' (known: ${ALL_SERVICES[*]})" ;;
  esac
}

svc_port() {
  case "$1" in
    postgres) printf '%s' "$EMFOLIO_PG_PORT" ;;
    redis) printf '%s' "$EMFOLIO_REDIS_PORT" ;;
    s3) printf '%s' "$EMFOLIO_S3_PORT" ;;
    smtp) printf '%s' "$EMFOLIO_SMTP_PORT" ;;
    uploadthing) printf '%s' "$EMFOLIO_UPLOADTHING_PORT" ;;
  esac
}

cmd_start() {
  check_bind_settings
  ensure_layout
  local name failed=()
  local t0=$SECONDS
  for name in "$@"; do
    if ! "$(svc_fn "$name" start)"; then
      failed+=("$name")
    fi
  done
  if ((${#failed[@]} > 0)); then
    die "failed to start: ${failed[*]} (logs in $(relpath "$LOG_DIR"))"
  fi
  say "services up ($*) in $((SECONDS - t0)) s"
}

cmd_stop() {
  local i name rc=0
  for ((i = $# ; i >= 1; i--)); do
    name="${!i}"
    "$(svc_fn "$name" stop)" || rc=1
  done
  return "$rc"
}

cmd_status() {
  local name state detail down=0
  for name in "$@"; do
    if "$(svc_fn "$name" probe)"; then
      state=up
    else
      state=down
      down=1
    fi
    detail="$("$(svc_fn "$name" status_detail)")"
    printf '%-11s %-6s %-5s %s\n' "$name" "$(svc_port "$name")" "$state" "$detail"
  done
  return "$down"
}

cmd_env() {
  # Beyond loopback (EMFOLIO_BIND_ADDRESS) clients are given that address, and Redis its password.
  local host redis_auth="" ufs_host=localhost
  host="$(service_host)"
  if bind_beyond_loopback; then
    redis_auth=":$(redis_secret)@"
    ufs_host="$host"
  fi
  cat <<ENV
# Local services (scripts/services.sh). Demo database and test database:
DATABASE_URL=postgresql://$PG_USER_NAME:$PG_USER_PASSWORD@$host:$EMFOLIO_PG_PORT/emfolio
TEST_DATABASE_URL=postgresql://$PG_USER_NAME:$PG_USER_PASSWORD@$host:$EMFOLIO_PG_PORT/emfolio_test
REDIS_URL=redis://${redis_auth}$host:$EMFOLIO_REDIS_PORT/0
TEST_REDIS_URL=redis://${redis_auth}$host:$EMFOLIO_REDIS_PORT/1
S3_ENDPOINT=http://$host:$EMFOLIO_S3_PORT
S3_REGION=us-east-1
S3_ACCESS_KEY_ID=S3RVER
S3_SECRET_ACCESS_KEY=$(s3_secret)
S3_FORCE_PATH_STYLE=true
S3_BUCKET=emfolio-captures
TEST_S3_BUCKET=emfolio-test
SMTP_HOST=$host
SMTP_PORT=$EMFOLIO_SMTP_PORT
SMTP_USER=emfolio
SMTP_PASSWORD=$(smtp_secret)
SMTP_URL=smtp://emfolio:$(smtp_secret)@$host:$EMFOLIO_SMTP_PORT
MAIL_DIR=.data/mail
UPLOADTHING_TOKEN=$(ut_app_token emfolio-demo)
TEST_UPLOADTHING_TOKEN=$(ut_app_token emfolio-test)
UPLOADTHING_INGEST_URL=http://$host:$EMFOLIO_UPLOADTHING_PORT
UPLOADTHING_API_URL=http://$host:$EMFOLIO_UPLOADTHING_PORT
UPLOADTHING_UFS_HOST=$ufs_host:$EMFOLIO_UPLOADTHING_PORT
UPLOADTHING_UFS_APP_ID_LOCATION=path
ENV
}

cmd_verify() {
  need_node_modules
  (cd "$PROJECT_ROOT" && "$TSX" "$SERVICES_DIR/verify.ts")
}

main() {
  (($# >= 1)) || usage
  local action="$1"
  shift
  local names=("$@")
  if ((${#names[@]} == 0)); then
    names=("${ALL_SERVICES[@]}")
  fi
  local n
  for n in "${names[@]}"; do svc_fn "$n" start >/dev/null; done
  case "$action" in
    start | stop | restart)
      # One start/stop at a time per checkout (e.g. up.sh and test.sh at once).
      ensure_layout
      exec 9>"$RUN_DIR/services.lock"
      flock -w 180 9 || die "another scripts/services.sh $action has held $(relpath "$RUN_DIR")/services.lock for 3 minutes"
      ;;
  esac
  case "$action" in
    start) cmd_start "${names[@]}" ;;
    stop) cmd_stop "${names[@]}" ;;
    status) cmd_status "${names[@]}" ;;
    restart)
      cmd_stop "${names[@]}"
      cmd_start "${names[@]}"
      ;;
    env) cmd_env ;;
    verify) cmd_verify ;;
    -h | --help | help) usage ;;
    *) usage ;;
  esac
}

main "$@"
