#!/usr/bin/env bash
# One worker process on simulated worker host INDEX, in the foreground (exec), with only the
# settings of the worker env file (a worker host's whole configuration; docs/deployment.md):
#   netns: inside network namespace <tag>-h<INDEX>, which reaches the services over its veth only
#   users: as system user <tag>w<INDEX>, in its own working directory, over a non-loopback address
# Started by scripts/hosts/drive.ts with EMFOLIO_HOSTS_MODE, _TAG and _RUN from scripts/hosts/run.sh.
#   bash scripts/hosts/start-worker.sh INDEX
set -euo pipefail
ROOT="$(cd "$(dirname "${BASH_SOURCE[0]}")/../.." && pwd)"
cd "$ROOT"
i="$1"
[[ "$i" =~ ^[0-9]+$ ]] || { echo "usage: start-worker.sh INDEX" >&2; exit 2; }
mode="${EMFOLIO_HOSTS_MODE:?}" tag="${EMFOLIO_HOSTS_TAG:?}" run="${EMFOLIO_HOSTS_RUN:?}"
mapfile -t settings < <(grep -E '^[A-Z][A-Z0-9_]*=' "$run/worker.env")
case "$mode" in
  netns)
    exec ip netns exec "$tag-h$i" env -i PATH="$PATH" HOME="$run" AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED=true \
      "${settings[@]}" node_modules/.bin/tsx worker/index.ts ;;
  users)
    cd "$run/home-$i"
    exec runuser -u "${tag}w$i" -- env -i PATH="$PATH" HOME="$run/home-$i" AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED=true \
      "${settings[@]}" "$ROOT/node_modules/.bin/tsx" --tsconfig "$ROOT/tsconfig.json" "$ROOT/worker/index.ts" ;;
  *) echo "EMFOLIO_HOSTS_MODE must be netns or users" >&2; exit 2 ;;
esac
