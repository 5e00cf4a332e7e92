#!/usr/bin/env bash
# Workers on other hosts, simulated on this machine (docs/deployment.md): its own PostgreSQL, Redis,
# S3 and SMTP fakes (the test ports + 200, data in .data/hosts) listening on a bridge address, and
# worker processes in network namespaces that reach them only over that bridge (their loopback is
# their own). A backlog of captures is registered and uploaded through the store while the queue is
# paused, then 1, 2 and 4 workers drain it; prints captures per minute. Needs root (ip netns).
# Where the kernel refuses network namespaces, the workers run as separate users in separate working
# directories and reach the services over this host's non-loopback address (mode "users").
#   bash scripts/hosts/run.sh [--short] [--captures N] [--rows R] [--workers 1,2,4] [--mode netns|users]
#   --short: one namespace, one worker, 3 captures: proves a worker on another "host" analyses end to end
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/../lib-setup.sh"

short=0 mode="" captures="" workers="" rows=""
while (($# > 0)); do
  case "$1" in
    --short) short=1 ;;
    --captures) captures="$2"; shift ;;
    --workers) workers="$2"; shift ;;
    --rows) rows="$2"; shift ;;
    --mode) mode="$2"; shift ;;
    *) echo "usage: bash scripts/hosts/run.sh [--short] [--captures N] [--rows R] [--workers 1,2,4] [--mode netns|users]" >&2; exit 2 ;;
  esac
  shift
done
((short)) && { captures="${captures:-3}"; workers="${workers:-1}"; rows="${rows:-20000}"; }
captures="${captures:-40}" workers="${workers:-1,2,4}" rows="${rows:-50000}"
[[ "$captures" =~ ^[0-9]+$ && "$rows" =~ ^[0-9]+$ && "$workers" =~ ^[0-9]+(,[0-9]+)*$ ]] || { echo "--captures N, --rows R and --workers 1,2,4 take whole numbers" >&2; exit 2; }
max_workers="$(tr ',' '\n' <<<"$workers" | sort -n | tail -n 1)"
((max_workers >= 1 && max_workers <= 16)) || { echo "--workers: 1 to 16 worker processes" >&2; exit 2; }
((EUID == 0)) || { echo "scripts/hosts/run.sh needs root (ip netns, veth, runuser)" >&2; exit 1; }

OFFSET="${EMFOLIO_HOSTS_PORT_OFFSET:-200}"
export EMFOLIO_PG_PORT=$((${EMFOLIO_PG_PORT:-54329} + OFFSET)) EMFOLIO_REDIS_PORT=$((${EMFOLIO_REDIS_PORT:-63799} + OFFSET))
export EMFOLIO_S3_PORT=$((${EMFOLIO_S3_PORT:-45690} + OFFSET)) EMFOLIO_SMTP_PORT=$((${EMFOLIO_SMTP_PORT:-2529} + OFFSET))
export EMFOLIO_UPLOADTHING_PORT=$((${EMFOLIO_UPLOADTHING_PORT:-45700} + OFFSET))
export EMFOLIO_DATA_DIR="$ROOT/.data/hosts"
HOST_SERVICES=(postgres redis s3 smtp)
# Names carry the PostgreSQL port, so two checkouts (other ports) never share a namespace or bridge.
TAG="e${EMFOLIO_PG_PORT}"
NET="${EMFOLIO_HOSTS_NET:-10.77.0}"   # a /24 of its own: the bridge is .1, worker host i is .(10+i)
BRIDGE="${TAG}br"
RUN="$EMFOLIO_DATA_DIR/run-hosts"
mkdir -p "$EMFOLIO_DATA_DIR" "$RUN"

namespaces=() users=() links=()
cleanup() {
  local rc=$?
  # Workers the driver left (it stops its own; this is for an interrupted run): by pid file, never by name.
  local f pid
  for f in "$RUN"/worker-*.pid; do
    [[ -f "$f" ]] || continue
    pid="$(tr -dc '0-9' <"$f")"
    [[ -n "$pid" ]] && kill -KILL -- "-$pid" 2>/dev/null || true
    rm -f "$f"
  done
  bash scripts/services.sh stop "${HOST_SERVICES[@]}" >/dev/null 2>&1 || true
  local ns link user
  for ns in "${namespaces[@]}"; do ip netns del "$ns" 2>/dev/null || true; done
  for link in "${links[@]}"; do ip link del "$link" 2>/dev/null || true; done
  for user in "${users[@]}"; do userdel "$user" 2>/dev/null || true; done
  exit "$rc"
}
trap cleanup EXIT
trap 'exit 130' INT TERM

fail() { echo "hosts run: $*" >&2; exit 1; }

# Namespaces and the bridge an earlier run of this checkout left (killed before its trap ran): ours by name.
remove_stale() {
  local ns
  for ns in $(ip netns list 2>/dev/null | awk '{ print $1 }' | grep -E "^${TAG}-(h[0-9]+|probe)$" || true); do ip netns del "$ns" 2>/dev/null || true; done
  ip link show "$BRIDGE" >/dev/null 2>&1 && ip link del "$BRIDGE" 2>/dev/null || true
}

# netns mode: a bridge with the services' address, one namespace per worker host on a veth pair.
# Returns 1 only when the kernel refuses namespaces or bridges (then the users mode runs); any later
# failure stops the run.
setup_netns() {
  remove_stale
  ip netns add "${TAG}-probe" 2>/dev/null || return 1
  ip netns del "${TAG}-probe"
  ip -4 -o addr show | grep -q " $NET\.1/" && fail "$NET.1 is already an address of this machine (another run? EMFOLIO_HOSTS_NET picks another /24)"
  ip link add "$BRIDGE" type bridge 2>/dev/null || return 1
  links+=("$BRIDGE")
  ip addr add "$NET.1/24" dev "$BRIDGE" || fail "cannot give $BRIDGE the address $NET.1"
  ip link set "$BRIDGE" up || fail "cannot bring $BRIDGE up"
  local i ns
  for ((i = 1; i <= max_workers; i++)); do
    ns="${TAG}-h$i"
    ip netns add "$ns" || fail "ip netns add $ns"
    namespaces+=("$ns")
    ip link add "${TAG}v$i" type veth peer name "${TAG}p$i" || fail "veth pair for $ns"
    links+=("${TAG}v$i")
    { ip link set "${TAG}v$i" master "$BRIDGE" up && ip link set "${TAG}p$i" netns "$ns" &&
      ip -n "$ns" addr add "$NET.$((10 + i))/24" dev "${TAG}p$i" && ip -n "$ns" link set "${TAG}p$i" up &&
      ip -n "$ns" link set lo up; } || fail "cannot wire $ns to $BRIDGE"
  done
  export EMFOLIO_BIND_ADDRESS="$NET.1" EMFOLIO_CLIENT_CIDR="$NET.0/24"
}

# users mode: this host's first global IPv4 address, one system user and working directory per worker.
setup_users() {
  local addr i user
  addr="$(ip -4 -o addr show scope global 2>/dev/null | awk '{ sub(/\/.*/, "", $4); print $4; exit }')"
  [[ -n "$addr" ]] || fail "no non-loopback IPv4 address on this machine for the users mode"
  for ((i = 1; i <= max_workers; i++)); do
    user="${TAG}w$i"
    if ! id "$user" >/dev/null 2>&1; then
      useradd --system --no-create-home --shell /usr/sbin/nologin "$user" || fail "useradd $user"
      users+=("$user")
    fi
    mkdir -p "$RUN/home-$i" && chown "$user" "$RUN/home-$i" || fail "working directory for $user"
  done
  export EMFOLIO_BIND_ADDRESS="$addr" EMFOLIO_CLIENT_CIDR="$addr/32"
}

case "$mode" in
  "") if setup_netns; then mode=netns; else echo "network namespaces refused here: separate users instead" >&2; setup_users; mode=users; fi ;;
  netns) setup_netns || { echo "ip netns add / bridge refused by this kernel" >&2; exit 1; } ;;
  users) setup_users ;;
  *) echo "--mode netns|users" >&2; exit 2 ;;
esac

for port in "$EMFOLIO_PG_PORT" "$EMFOLIO_REDIS_PORT" "$EMFOLIO_S3_PORT" "$EMFOLIO_SMTP_PORT"; do ensure_port_free "$port" "a service of the hosts run"; done
bash scripts/services.sh start "${HOST_SERVICES[@]}" >/dev/null
# The env a worker host gets, and nothing else: services at the bind address (docs/deployment.md).
write_test_env 3299 emfolio-hosts "$RUN/worker.env"
{ echo "WORKER_CONCURRENCY=1"; echo "MAIL_DIR="; } >>"$RUN/worker.env"
chmod 644 "$RUN/worker.env"
load_env_file "$RUN/worker.env"
node_modules/.bin/tsx scripts/reset-test-db.ts >/dev/null
node_modules/.bin/tsx scripts/migrate.ts >/dev/null
node_modules/.bin/tsx scripts/seed.ts >/dev/null
export EMFOLIO_HOSTS_MODE="$mode" EMFOLIO_HOSTS_TAG="$TAG" EMFOLIO_HOSTS_RUN="$RUN"
node_modules/.bin/tsx --import ./scripts/support/server-only-hook.mjs scripts/hosts/drive.ts \
  --mode "$mode" --tag "$TAG" --run-dir "$RUN" --captures "$captures" --workers "$workers" --rows "$rows" $( ((short)) && echo --short)
