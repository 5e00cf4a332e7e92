#!/usr/bin/env bash
# Installs the Debian packages Emfolio needs, only those missing, with at most
# one `apt-get update`. Idempotent and fast (one dpkg-query) when nothing is
# missing. Needs root only when something has to be installed.
#
#   bash scripts/services/ensure-packages.sh [--check]
#
# --check: list what is missing and exit 1 if anything is, install nothing.
set -euo pipefail

# Major versions: Debian 12's (the image in docker/Dockerfile is bookworm too). docker/compose.yaml
# runs the same majors (postgres:15, redis:7); tests/unit/scripts/docker-consistency.test.ts checks.
PG_MAJOR=15
REDIS_MAJOR=7

PACKAGES=(
  "postgresql-$PG_MAJOR" # database (scripts/services.sh)
  redis-server   # queue (scripts/services.sh), Redis $REDIS_MAJOR on Debian 12
  chromium       # end-to-end tests (Playwright, executablePath /usr/bin/chromium)
  poppler-utils  # pdftoppm/pdftotext: checking generated PDF reports
  python3-numpy  # reference implementation in the benchmark (scripts/bench)
  python3-scipy
  python3-pandas
  curl           # scripts/services.sh probes and verify
  iproute2       # ss: who holds a port
  procps         # ps: process groups of the Node fakes
)

check_only=0
if [[ "${1:-}" == "--check" ]]; then
  check_only=1
elif [[ $# -gt 0 ]]; then
  echo "usage: bash scripts/services/ensure-packages.sh [--check]" >&2
  exit 2
fi

mapfile -t installed < <(dpkg-query -W -f='${Package} ${Status}\n' "${PACKAGES[@]}" 2>/dev/null |
  awk '$NF == "installed" && $(NF-1) == "ok" { print $1 }')

missing=()
for pkg in "${PACKAGES[@]}"; do
  found=0
  for have in "${installed[@]}"; do
    if [[ "$have" == "$pkg" ]]; then
      found=1
      break
    fi
  done
  ((found)) || missing+=("$pkg")
done

# A Redis of another major (another Debian release) is named, not replaced.
if command -v redis-server >/dev/null 2>&1; then
  redis_major="$(redis-server --version | sed -n 's/.* v=\([0-9]*\)\..*/\1/p')"
  [[ "$redis_major" == "$REDIS_MAJOR" ]] || echo "packages: redis-server is version $redis_major, docker/compose.yaml runs $REDIS_MAJOR" >&2
fi

if ((${#missing[@]} == 0)); then
  echo "packages: all present (${PACKAGES[*]})"
  exit 0
fi

echo "packages: missing ${missing[*]}"
if ((check_only)); then
  exit 1
fi
if ((EUID != 0)); then
  echo "error: installing ${missing[*]} needs root (apt-get)" >&2
  exit 1
fi

export DEBIAN_FRONTEND=noninteractive
apt-get update -qq
# Post-install scripts of postgresql/redis-server warn that they cannot start
# services (no init system) and exit 0; we start our own instances anyway.
apt-get install -y -qq "${missing[@]}"
echo "packages: installed ${missing[*]}"
