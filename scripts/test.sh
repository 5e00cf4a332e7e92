#!/usr/bin/env bash
# The whole test suite: type-check, lint, unit, integration against the real services, end-to-end in Chromium.
# Uses its own database (emfolio_test), Redis db 1 with its own queue prefix, bucket emfolio-test and port 3100,
# so a running demo is not touched. Services this script had to start are stopped again at the end.
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/lib-setup.sh"

RESULTS=.data/test-results
E2E_PORT="${EMFOLIO_E2E_PORT:-3100}"

step "Debian packages"
bash scripts/services/ensure-packages.sh
ensure_node_modules

step "local services"
start_services_tracked

pids=()
cleanup() {
  for pid in "${pids[@]}"; do kill -TERM "$pid" 2>/dev/null || true; done
  for pid in "${pids[@]}"; do wait "$pid" 2>/dev/null || true; done
  stop_services_started_here
}
trap cleanup EXIT

mkdir -p "$RESULTS" .data/log
rm -f "$RESULTS"/*.json
write_test_env "$E2E_PORT" emfolio-test .data/env.test
load_env_file .data/env.test
export E2E_BASE_URL="http://127.0.0.1:$E2E_PORT"

step "fresh test database"
node_modules/.bin/tsx scripts/reset-test-db.ts
node_modules/.bin/tsx scripts/preflight.ts
node_modules/.bin/tsx scripts/migrate.ts
node_modules/.bin/tsx scripts/seed.ts

step "type-check and lint"
node_modules/.bin/tsc --noEmit
node_modules/.bin/eslint . --max-warnings 0

status=0
step "unit tests"
node_modules/.bin/vitest run --project unit --reporter=default --reporter=json --outputFile.json="$RESULTS/unit.json" || status=1
step "integration tests"
node_modules/.bin/vitest run --project integration --reporter=default --reporter=json --outputFile.json="$RESULTS/integration.json" || status=1

step "fault run, short form (own services on the test ports + 100)"
bash scripts/faults/run.sh --short || status=1

step "workers on other hosts, short form (a worker in a network namespace; own services on the test ports + 200)"
if ((EUID == 0)); then
  bash scripts/hosts/run.sh --short || status=1
else
  echo "not run: network namespaces need root (run the suite as root, or see docs/deployment.md)"
fi

step "end-to-end tests (Chromium)"
export EMFOLIO_DIST_DIR=.next-test
node_modules/.bin/next build >.data/log/test-build.log 2>&1 || { tail -50 .data/log/test-build.log; exit 1; }
ensure_port_free "$E2E_PORT" "the test web app (EMFOLIO_E2E_PORT)"
node_modules/.bin/tsx scripts/serve.ts --host 127.0.0.1 --port "$E2E_PORT" >.data/log/test-web.log 2>&1 &
pids+=($!)
node_modules/.bin/tsx worker/index.ts >.data/log/test-worker.log 2>&1 &
pids+=($!)
wait_for_web "$E2E_BASE_URL" || { tail -30 .data/log/test-web.log; exit 1; }
# The demo scenario's captures give the review, trends and report tests analysed units to work on.
node_modules/.bin/tsx --import ./scripts/support/server-only-hook.mjs scripts/seed-captures.ts >.data/log/test-seed-captures.log 2>&1 || { tail -20 .data/log/test-seed-captures.log; exit 1; }
PLAYWRIGHT_JSON_OUTPUT_NAME="$RESULTS/e2e.json" node_modules/.bin/playwright test --reporter=list,json || status=1

step "two web processes on one port (one killed and replaced)"
bash scripts/support/web-processes.sh "$((E2E_PORT + 1))" || status=1

node_modules/.bin/tsx scripts/test-summary.ts "$RESULTS"/*.json || status=1
exit "$status"
