#!/usr/bin/env bash
# npm run bench -- --data-scale [--reseed] [--rebuild] [--duration S] [--concurrency 10,50] [--only name,name]
#                               [--web-processes N]
# Seeds (or reuses) the emfolio_scale database with 1 000 000 captures, builds (or reuses) the app in
# .next-scale, serves it worker-less on 127.0.0.1:$EMFOLIO_SCALE_PORT (default 3160) against that
# database, measures every page at 10 and 50 concurrent signed-in requests (the web app as N processes
# with --web-processes N, default 1), then prints the
# EXPLAIN (ANALYZE, BUFFERS) of the heaviest queries. Starts only the services that are not running.
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/../../lib-setup.sh"

PORT="${EMFOLIO_SCALE_PORT:-3160}"
seed_args=() build=auto measure_args=() processes=1
while (($# > 0)); do
  case "$1" in
    --reseed) seed_args+=(--reseed) ;;
    --rebuild) build=always ;;
    --web-processes) processes="$2"; shift ;;
    --duration|--concurrency|--only) measure_args+=("$1" "$2"); shift ;;
    *) echo "unknown option $1" >&2; exit 2 ;;
  esac
  shift
done
start_services_tracked >/dev/null
trap stop_services_started_here EXIT
mkdir -p .data/log
# The test settings with the scale database; no worker is started, so nothing is analysed meanwhile.
write_test_env "$PORT" emfolio-scale .data/env.scale
sed -i -E 's#^(DATABASE_URL=.*/)emfolio_test$#\1emfolio_scale#' .data/env.scale
load_env_file .data/env.scale
TSX=(node_modules/.bin/tsx --import ./scripts/support/server-only-hook.mjs)

step "data-scale database"
"${TSX[@]}" scripts/bench/data-scale/seed.ts "${seed_args[@]}"

export EMFOLIO_DIST_DIR=.next-scale
stamp="$( (git rev-parse HEAD; git diff HEAD; git ls-files --others --exclude-standard | xargs -r cat) | sha256sum | cut -d' ' -f1)"
if [[ "$build" == always || ! -f .next-scale/BUILD_ID || "$(cat .next-scale/.emfolio-source 2>/dev/null)" != "$stamp" ]]; then
  step "building the app into .next-scale (log: .data/log/scale-build.log)"
  started=$SECONDS
  nice -n 10 node_modules/.bin/next build >.data/log/scale-build.log 2>&1 || { tail -20 .data/log/scale-build.log; exit 1; }
  printf '%s' "$stamp" >.next-scale/.emfolio-source
  echo "built in $((SECONDS - started)) s"
else
  echo "reusing the build in .next-scale (same sources)"
fi

ensure_port_free "$PORT" "the data-scale app (EMFOLIO_SCALE_PORT)"
node_modules/.bin/tsx scripts/serve.ts --host 127.0.0.1 --port "$PORT" --processes "$processes" >.data/log/scale-web.log 2>&1 &
web=$!
trap 'kill -TERM "$web" 2>/dev/null || true; wait "$web" 2>/dev/null || true; stop_services_started_here' EXIT
wait_for_web "http://127.0.0.1:$PORT"
step "pages at scale, $processes web process(es) ($(uptime | sed 's/.*load/load/'))"
"${TSX[@]}" scripts/bench/data-scale/measure.ts --base-url "http://127.0.0.1:$PORT" "${measure_args[@]}"
step "EXPLAIN (ANALYZE, BUFFERS) of the heaviest queries"
"${TSX[@]}" scripts/bench/data-scale/explain.ts
echo "machine: $(uptime)"
