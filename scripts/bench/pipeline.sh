#!/usr/bin/env bash
# The pipeline section of `npm run bench`: 200 captures of 1e5 rows through the bench API of an app
# started here on the test database (port 3150, queue prefix emfolio-bench), with 1 and 2 worker
# processes. Reports captures per minute and p95 upload-complete → analysed. Then one capture of
# EMFOLIO_BENCH_LARGE_MIB (default 1024; 0 skips it) through the same app and a worker, against the
# engine on the same file from local disk. It does not pass or fail.
#   bash scripts/bench/pipeline.sh [--captures N] [--rows R] [--workers 1,2]
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/../lib-setup.sh"

PORT="${EMFOLIO_BENCH_PORT:-3150}"
start_services_tracked >/dev/null
mkdir -p .data/log
write_test_env "$PORT" emfolio-bench .data/env.bench
load_env_file .data/env.bench
node_modules/.bin/tsx scripts/reset-test-db.ts >/dev/null
node_modules/.bin/tsx scripts/migrate.ts >/dev/null
node_modules/.bin/tsx scripts/seed.ts >/dev/null
export EMFOLIO_DIST_DIR=.next-test
# Always rebuilt, so the figures are of the code checked out (the test command shares this folder).
echo "building the app (log: .data/log/bench-build.log)"
node_modules/.bin/next build >.data/log/bench-build.log 2>&1 || { tail -20 .data/log/bench-build.log; exit 1; }
ensure_port_free "$PORT" "the benchmark's web app (EMFOLIO_BENCH_PORT)"
node_modules/.bin/tsx scripts/serve.ts --host 127.0.0.1 --port "$PORT" >.data/log/bench-web.log 2>&1 &
web=$!
trap 'kill -TERM "$web" 2>/dev/null || true; wait "$web" 2>/dev/null || true; stop_services_started_here' EXIT
wait_for_web "http://127.0.0.1:$PORT"
echo
echo "== health probes: 50 concurrent connections, 10 s each, loopback"
node --import tsx scripts/bench/health-load.ts --base-url "http://127.0.0.1:$PORT"
args=("$@")
((${#args[@]} > 0)) || args=(--captures 200 --rows 100000 --workers 1,2)
echo
echo "== pipeline: captures through the bench API and the worker"
node --import tsx scripts/bench-pipeline.ts --base-url "http://127.0.0.1:$PORT" "${args[@]}"
LARGE_MIB="${EMFOLIO_BENCH_LARGE_MIB:-1024}"
if ((LARGE_MIB > 0)); then
  echo
  echo "== large capture: ${LARGE_MIB} MiB through the bench API and one worker"
  node --import tsx scripts/bench/large-capture.ts --base-url "http://127.0.0.1:$PORT" --mib "$LARGE_MIB"
fi
