# shellcheck shell=bash
# shellcheck disable=SC2034 # variables here are used by the files that source this one
# Shared settings and helpers for scripts/services.sh and its helpers.
# Sourced, never executed. Reads only the EMFOLIO_*_PORT variables and EMFOLIO_DATA_DIR (with
# defaults); nothing here needs the app's .env.

SERVICES_DIR="$(cd "$(dirname "${BASH_SOURCE[0]}")" && pwd)"
PROJECT_ROOT="$(cd "$SERVICES_DIR/../.." && pwd)"

EMFOLIO_PG_PORT="${EMFOLIO_PG_PORT:-54329}"
EMFOLIO_REDIS_PORT="${EMFOLIO_REDIS_PORT:-63799}"
EMFOLIO_S3_PORT="${EMFOLIO_S3_PORT:-45690}"
EMFOLIO_SMTP_PORT="${EMFOLIO_SMTP_PORT:-2529}"
EMFOLIO_UPLOADTHING_PORT="${EMFOLIO_UPLOADTHING_PORT:-45700}"

# EMFOLIO_BIND_ADDRESS: an IPv4 address the services listen on besides 127.0.0.1, for clients on
# other hosts (workers and web instances; docs/deployment.md). Default 127.0.0.1: loopback only.
# Beyond loopback PostgreSQL admits EMFOLIO_CLIENT_CIDR (scram-sha-256, required then), Redis
# requires a password (.data/redis-secret), and the S3, SMTP and uploadthing fakes keep their own auth.
EMFOLIO_BIND_ADDRESS="${EMFOLIO_BIND_ADDRESS:-127.0.0.1}"
EMFOLIO_CLIENT_CIDR="${EMFOLIO_CLIENT_CIDR:-}"

# EMFOLIO_DATA_DIR gives a second set of services (other ports) a folder of its own (the fault script).
DATA_DIR="${EMFOLIO_DATA_DIR:-$PROJECT_ROOT/.data}"
RUN_DIR="$DATA_DIR/run"
LOG_DIR="$DATA_DIR/log"

TSX="$PROJECT_ROOT/node_modules/.bin/tsx"

# Seconds to wait for a service to answer after starting it.
START_TIMEOUT_PG=60
START_TIMEOUT_DEFAULT=30

# All services, in start order (stop runs in reverse).
ALL_SERVICES=(postgres redis s3 smtp uploadthing)

say() { printf '%s\n' "$*"; }
warn() { printf '%s\n' "$*" >&2; }
die() {
  warn "error: $*"
  exit 1
}

ensure_layout() {
  mkdir -p "$DATA_DIR" "$RUN_DIR" "$LOG_DIR"
  # The postgres user must be able to traverse .data (its cluster lives there).
  chmod 755 "$DATA_DIR" "$RUN_DIR" "$LOG_DIR"
}

# relpath PATH: PATH relative to the project root when inside it, for messages.
relpath() {
  case "$1" in
    "$PROJECT_ROOT"/*) printf '%s' "${1#"$PROJECT_ROOT"/}" ;;
    *) printf '%s' "$1" ;;
  esac
}

# wait_for SECONDS CMD...: retry CMD every 0.25 s until it succeeds or time runs out.
wait_for() {
  local timeout="$1"
  shift
  local deadline=$((SECONDS + timeout))
  while ((SECONDS < deadline)); do
    if "$@" >/dev/null 2>&1; then
      return 0
    fi
    sleep 0.25
  done
  "$@" >/dev/null 2>&1
}

# wait_gone SECONDS CMD...: wait until CMD stops succeeding.
wait_gone() {
  local timeout="$1"
  shift
  local deadline=$((SECONDS + timeout))
  while ((SECONDS < deadline)); do
    if ! "$@" >/dev/null 2>&1; then
      return 0
    fi
    sleep 0.25
  done
  ! "$@" >/dev/null 2>&1
}

# fail_start NAME LOGFILE: report a service that did not come up, with its log tail.
fail_start() {
  local name="$1" log="$2"
  warn "error: $name did not come up; see $(relpath "$log")"
  if [[ -f "$log" ]]; then
    warn "---- last lines of $(relpath "$log") ----"
    tail -n 20 "$log" >&2 || true
    warn "----"
  fi
  return 1
}

# tcp_open PORT: something accepts TCP connections on 127.0.0.1:PORT.
tcp_open() {
  (exec 3<>"/dev/tcp/127.0.0.1/$1") 2>/dev/null
}

# proc_alive PID: PID is a running process. A zombie does not count: on this
# kind of machine PID 1 reaps orphans only after a second or two.
proc_alive() {
  local state
  [[ -n "$1" && -r "/proc/$1/stat" ]] || return 1
  state="$(sed 's/.*) //' "/proc/$1/stat" 2>/dev/null | cut -d' ' -f1)" || return 1
  [[ -n "$state" && "$state" != Z && "$state" != X ]]
}

# proc_exists PID: PID is in the process table (running or not yet reaped).
proc_exists() {
  kill -0 "$1" 2>/dev/null
}

# pid_alive PIDFILE: the pid in PIDFILE is a running process.
pid_alive() {
  local pidfile="$1" pid
  [[ -s "$pidfile" ]] || return 1
  pid="$(tr -dc '0-9' <"$pidfile")"
  proc_alive "$pid"
}

read_pid() {
  tr -dc '0-9' <"$1"
}

# listener_pid PORT: pid of the process listening on 127.0.0.1:PORT (empty if none).
listener_pid() {
  ss -Hltnp "sport = :$1" 2>/dev/null | sed -n 's/.*pid=\([0-9]*\).*/\1/p' | head -n 1
}

# apt_install PKG...: install Debian packages, running `apt-get update` at most
# once per invocation of the calling script.
APT_UPDATED=0
apt_install() {
  ((EUID == 0)) || die "installing $* needs root (apt-get)"
  export DEBIAN_FRONTEND=noninteractive
  if ((APT_UPDATED == 0)); then
    say "apt-get update"
    apt-get update -qq
    APT_UPDATED=1
  fi
  say "apt-get install -y $*"
  apt-get install -y -qq "$@"
}

# pkg_installed PKG: the Debian package is installed.
pkg_installed() {
  [[ "$(dpkg-query -W -f='${Status}' "$1" 2>/dev/null)" == "install ok installed" ]]
}

# bind_beyond_loopback: the services also listen on EMFOLIO_BIND_ADDRESS.
bind_beyond_loopback() {
  [[ "$EMFOLIO_BIND_ADDRESS" != "127.0.0.1" ]]
}

# check_bind_settings: stops with a message on a bind address or client network that is not IPv4.
check_bind_settings() {
  local ipv4='^([0-9]{1,3}\.){3}[0-9]{1,3}$'
  [[ "$EMFOLIO_BIND_ADDRESS" =~ $ipv4 ]] || die "EMFOLIO_BIND_ADDRESS must be an IPv4 address (got '$EMFOLIO_BIND_ADDRESS')"
  bind_beyond_loopback || return 0
  [[ "$EMFOLIO_CLIENT_CIDR" =~ ^([0-9]{1,3}\.){3}[0-9]{1,3}/[0-9]{1,2}$ ]] ||
    die "EMFOLIO_BIND_ADDRESS=$EMFOLIO_BIND_ADDRESS needs EMFOLIO_CLIENT_CIDR, the network PostgreSQL admits (e.g. 10.77.0.0/24)"
}

# service_host: the address clients are given (scripts/services.sh env).
service_host() {
  printf '%s' "$EMFOLIO_BIND_ADDRESS"
}

need_node_modules() {
  [[ -x "$TSX" && -d "$PROJECT_ROOT/node_modules/s3rver" && -d "$PROJECT_ROOT/node_modules/smtp-server" ]] ||
    die "node_modules is incomplete (tsx, s3rver, smtp-server): run 'npm ci' first"
}
