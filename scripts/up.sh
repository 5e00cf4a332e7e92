#!/usr/bin/env bash
# One command for a fresh Debian machine: packages, services, migrations, demo data, build, serve.
#   bash scripts/up.sh            serve in the foreground (Ctrl-C stops the web app and the worker)
#   bash scripts/up.sh --detach   serve in the background (logs in .data/log/, stop with scripts/down.sh)
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/lib-setup.sh"

detach=false
[[ "${1:-}" == "--detach" ]] && detach=true

step "Debian packages"
bash scripts/services/ensure-packages.sh
ensure_node_modules
step "local services"
bash scripts/services.sh start
ensure_dotenv
load_env_file .env
step "migrations and demo data"
node_modules/.bin/tsx scripts/preflight.ts
node_modules/.bin/tsx scripts/migrate.ts
node_modules/.bin/tsx scripts/seed.ts
step "build"
node_modules/.bin/next build
mkdir -p .data/log .data/run

bash scripts/down.sh --quiet
ensure_port_free 3000 "the web app"
node_modules/.bin/tsx worker/index.ts >>.data/log/worker.log 2>&1 &
echo $! >.data/run/worker.pid
step "demo captures (analysed by the worker in the background)"
node_modules/.bin/tsx --import ./scripts/support/server-only-hook.mjs scripts/seed-captures.ts
step "demo release (the quality engineer signs the first report once its unit is analysed)"
node_modules/.bin/tsx --import ./scripts/support/server-only-hook.mjs scripts/seed-release.ts || echo "The demo report was not released (see above); the app runs without it."
if $detach; then
  nohup node_modules/.bin/tsx scripts/serve.ts --host 127.0.0.1 --port 3000 >>.data/log/web.log 2>&1 &
  echo $! >.data/run/web.pid
  wait_for_web http://127.0.0.1:3000
  echo "Emfolio is up on http://127.0.0.1:3000 (worker and web in the background; bash scripts/down.sh stops them)"
else
  trap 'bash scripts/down.sh --quiet' EXIT
  echo "Emfolio on http://127.0.0.1:3000 — demo accounts in README.md. Ctrl-C stops the web app and the worker."
  node_modules/.bin/tsx scripts/serve.ts --host 127.0.0.1 --port 3000
fi
