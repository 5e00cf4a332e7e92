#!/usr/bin/env bash
# Checks `scripts/serve.ts --processes 2` on a built app: both processes share one port, a process
# killed with SIGKILL is replaced, and the app answers throughout and after; SIGTERM stops them all.
#   bash scripts/support/web-processes.sh PORT    (EMFOLIO_DIST_DIR names the build, as for serve.ts)
set -euo pipefail
source "$(dirname "${BASH_SOURCE[0]}")/../lib-setup.sh"
port="${1:?usage: bash scripts/support/web-processes.sh PORT}"
base="http://127.0.0.1:$port"
log="$ROOT/.data/log/test-web-processes.log"
ensure_port_free "$port" "the two-process web check"

node_modules/.bin/tsx scripts/serve.ts --host 127.0.0.1 --port "$port" --processes 2 >"$log" 2>&1 &
launcher=$!
trap 'kill -TERM "$launcher" 2>/dev/null || true' EXIT

# The process tree: tsx's launcher -> the cluster's primary -> one process per --processes.
children_of() { ps -o pid= --ppid "$1" 2>/dev/null | tr -d ' ' || true; }
web_processes() {
  local p c
  for p in $(children_of "$launcher"); do
    for c in $(children_of "$p"); do
      grep -q "scripts/serve.ts" "/proc/$c/cmdline" 2>/dev/null && echo "$c"
    done
  done
  return 0
}
fail() { echo "web processes: $1 (log: $log)" >&2; tail -20 "$log" >&2; exit 1; }

# wait_for_log TEXT: the primary's log names each step (all listening, a replacement listening).
wait_for_log() {
  local _
  for _ in $(seq 1 60); do grep -qF -- "$1" "$log" && return 0; sleep 1; done
  return 1
}

wait_for_log "Emfolio on $base (2 processes)" || fail "the 2 processes did not both listen within 60 s"
wait_for_web "$base" || fail "the app did not answer"
before="$(web_processes | sort)"
(($(wc -w <<<"$before") == 2)) || fail "expected 2 web processes, found: ${before:-none}"
victim="$(head -n 1 <<<"$before")"
kill -KILL "$victim"

replaced=""
for _ in $(seq 1 60); do
  now="$(web_processes | sort)"
  if (($(wc -w <<<"$now") == 2)) && ! grep -qx "$victim" <<<"$now"; then replaced="$now"; break; fi
  sleep 1
done
[[ -n "$replaced" ]] || fail "process $victim was not replaced within 60 s (now: ${now:-none})"
grep -q "ended (SIGKILL); starting another" "$log" || fail "the primary did not report the ended process"
wait_for_log "listening in place of one that ended" || fail "the new process did not listen within 60 s"
# Each request may land on either process; 20 in a row must all answer.
for _ in $(seq 1 20); do
  curl -fsS -o /dev/null "$base/api/health/live" || fail "a liveness probe failed after the replacement"
  curl -fsS -o /dev/null "$base/sign-in" || fail "the sign-in page failed after the replacement"
done

kill -TERM "$launcher"
for _ in $(seq 1 30); do
  [[ -z "$(web_processes)" ]] && ! kill -0 "$launcher" 2>/dev/null && break
  sleep 1
done
[[ -z "$(web_processes)" ]] || fail "web processes left after SIGTERM: $(web_processes | tr '\n' ' ')"
trap - EXIT
echo "web processes: 2 served one port; process $victim killed and replaced by $(grep -vx "$victim" <<<"$replaced" | grep -vxF "$before" | tr '\n' ' '); 40 requests answered after; SIGTERM stopped all"
