#!/usr/bin/env bash
# The fault run: its own PostgreSQL, Redis and S3 fake (ports of the test services + 100, data in
# .data/faults), two workers, and one fault at a time (scripts/faults/drive.ts). Prints a table of
# captures, analysed, failed and lost per fault; exits 1 if any capture failed or was lost.
#   bash scripts/faults/run.sh [--short]     (--short: outages of 5–10 s, about a minute; the test command runs it)
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/../lib-setup.sh"

OFFSET="${EMFOLIO_FAULT_PORT_OFFSET:-100}"
export EMFOLIO_PG_PORT=$((${EMFOLIO_PG_PORT:-54329} + OFFSET)) EMFOLIO_REDIS_PORT=$((${EMFOLIO_REDIS_PORT:-63799} + OFFSET))
export EMFOLIO_S3_PORT=$((${EMFOLIO_S3_PORT:-45690} + OFFSET)) EMFOLIO_SMTP_PORT=$((${EMFOLIO_SMTP_PORT:-2529} + OFFSET))
export EMFOLIO_UPLOADTHING_PORT=$((${EMFOLIO_UPLOADTHING_PORT:-45700} + OFFSET))
export EMFOLIO_DATA_DIR="$ROOT/.data/faults"
FAULT_SERVICES=(postgres redis s3)

mkdir -p "$EMFOLIO_DATA_DIR"
stop_fault_services() { bash scripts/services.sh stop "${FAULT_SERVICES[@]}" >/dev/null 2>&1 || true; }
trap stop_fault_services EXIT
for port in "$EMFOLIO_PG_PORT" "$EMFOLIO_REDIS_PORT" "$EMFOLIO_S3_PORT"; do ensure_port_free "$port" "a service of the fault run"; done
bash scripts/services.sh start "${FAULT_SERVICES[@]}" >/dev/null
write_test_env 3199 emfolio-faults "$EMFOLIO_DATA_DIR/env"
load_env_file "$EMFOLIO_DATA_DIR/env"
node_modules/.bin/tsx scripts/reset-test-db.ts >/dev/null
node_modules/.bin/tsx scripts/migrate.ts >/dev/null
node_modules/.bin/tsx scripts/seed.ts >/dev/null
node_modules/.bin/tsx --import ./scripts/support/server-only-hook.mjs scripts/faults/drive.ts "$@"
