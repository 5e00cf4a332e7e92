#!/usr/bin/env bash
# Stops the web app and worker started by scripts/up.sh. `--services` also stops the local services.
set -euo pipefail
cd "$(dirname "${BASH_SOURCE[0]}")/.."
quiet=false
for arg in "$@"; do [[ "$arg" == "--quiet" ]] && quiet=true; done
for name in web worker; do
  pidfile=".data/run/$name.pid"
  [[ -f "$pidfile" ]] || continue
  pid="$(cat "$pidfile")"
  if kill -0 "$pid" 2>/dev/null; then
    kill -TERM "$pid" 2>/dev/null || true
    for _ in $(seq 1 50); do kill -0 "$pid" 2>/dev/null || break; sleep 0.2; done
    $quiet || echo "stopped $name ($pid)"
  fi
  rm -f "$pidfile"
done
for arg in "$@"; do [[ "$arg" == "--services" ]] && bash scripts/services.sh stop; done
exit 0
