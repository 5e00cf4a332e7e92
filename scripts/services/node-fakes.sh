# shellcheck shell=bash
# Local Node fakes for scripts/services.sh (S3 via s3rver, SMTP via smtp-server,
# uploadthing's ingest and API service via uploadthing-server.ts).
# Sourced after lib.sh. Each runs detached (setsid + nohup) in its own process
# group; log in .data/log/<name>.log, pid in .data/run/<name>.pid.

S3_DIR="$DATA_DIR/s3"

# also_listen_args: the fakes' flag for EMFOLIO_BIND_ADDRESS (nothing on loopback only). Unquoted
# on purpose where used: it is zero or two words, neither with spaces.
also_listen_args() {
  if bind_beyond_loopback; then printf -- '--also-listen %s' "$EMFOLIO_BIND_ADDRESS"; fi
}
S3_BUCKETS=(emfolio-captures emfolio-test)
MAIL_DIR="$DATA_DIR/mail"
UT_DIR="$DATA_DIR/uploadthing"

s3_probe() {
  local code
  code="$(curl -s -o /dev/null -w '%{http_code}' --max-time 2 "http://127.0.0.1:$EMFOLIO_S3_PORT/" 2>/dev/null)" || true
  [[ -n "$code" && "$code" != "000" ]]
}

# Reads the SMTP greeting; a 220 line means the fake is ready.
smtp_probe() {
  (
    exec 3<>"/dev/tcp/127.0.0.1/$EMFOLIO_SMTP_PORT" || exit 1
    line=""
    IFS= read -r -t 3 line <&3 || exit 1
    printf 'QUIT\r\n' >&3 || true
    exec 3>&-
    [[ "$line" == 220* ]]
  ) 2>/dev/null
}

# node_fake_start NAME PORT PROBE CMD...
node_fake_start() {
  local name="$1" port="$2" probe="$3"
  shift 3
  local pidfile="$RUN_DIR/$name.pid" log="$LOG_DIR/$name.log"
  need_node_modules
  if pid_alive "$pidfile"; then
    local running_port
    running_port="$(cat "$RUN_DIR/$name.port" 2>/dev/null || true)"
    if [[ -n "$running_port" && "$running_port" != "$port" ]]; then
      warn "$name: already running from this checkout on port $running_port (pid $(read_pid "$pidfile")), not $port; stop it first"
      return 1
    fi
    # Ours and alive: it answers, or is still starting, or is stuck.
    local deadline=$((SECONDS + START_TIMEOUT_DEFAULT))
    while ((SECONDS < deadline)) && pid_alive "$pidfile"; do
      if "$probe"; then
        say "$name: already running on 127.0.0.1:$port (pid $(read_pid "$pidfile"))"
        return 0
      fi
      sleep 0.25
    done
    if pid_alive "$pidfile"; then
      warn "$name: pid $(read_pid "$pidfile") is running but does not answer on port $port; try 'scripts/services.sh restart $name'"
      fail_start "$name" "$log"
      return 1
    fi
  fi
  rm -f "$pidfile" "$RUN_DIR/$name.port"
  if "$probe"; then
    say "$name: already answering on 127.0.0.1:$port (pid $(listener_pid "$port"), no pid file: not started by this checkout?)"
    return 0
  fi
  if tcp_open "$port"; then
    die "$name: port $port is taken by another process (pid $(listener_pid "$port")); set the port variable"
  fi
  say "$name: starting on 127.0.0.1:$port"
  printf '\n==== %s start %s ====\n' "$name" "$(date -u +%Y-%m-%dT%H:%M:%SZ)" >>"$log"
  # fd 9 is the services.lock: the daemon must not keep it.
  # Not a process-group leader here (no job control), so setsid keeps the pid:
  # pid == process group id, and stop can signal the whole group.
  (cd "$PROJECT_ROOT" && exec setsid nohup "$@" >>"$log" 2>&1 </dev/null 9>&-) &
  printf '%s\n' "$!" >"$pidfile"
  printf '%s\n' "$port" >"$RUN_DIR/$name.port"
  local deadline=$((SECONDS + START_TIMEOUT_DEFAULT))
  while ((SECONDS < deadline)); do
    if "$probe"; then
      # Should setsid have forked after all, record the real listener.
      pid_alive "$pidfile" || listener_pid "$port" >"$pidfile"
      return 0
    fi
    if ! pid_alive "$pidfile"; then
      rm -f "$pidfile" "$RUN_DIR/$name.port"
      fail_start "$name" "$log"
      return 1
    fi
    sleep 0.25
  done
  fail_start "$name" "$log"
  return 1
}

# Our own process, judged by its command line (so a recycled pid is never killed).
node_fake_owns() {
  local pid="$1" marker="$2"
  [[ -r "/proc/$pid/cmdline" ]] && tr '\0' ' ' <"/proc/$pid/cmdline" | grep -qF -- "$marker"
}

# node_fake_stop NAME PORT MARKER
node_fake_stop() {
  local name="$1" port="$2" marker="$3"
  local pidfile="$RUN_DIR/$name.pid" pid=""
  if pid_alive "$pidfile"; then
    pid="$(read_pid "$pidfile")"
  else
    # No pid file (or a stale one): look for our own process on the port.
    pid="$(listener_pid "$port")"
    if [[ -z "$pid" ]] || ! node_fake_owns "$pid" "$marker"; then
      rm -f "$pidfile" "$RUN_DIR/$name.port"
      if [[ -n "$pid" ]]; then
        warn "$name: port $port is held by pid $pid, which is not ours; left alone"
      else
        say "$name: not running"
      fi
      return 0
    fi
  fi
  say "$name: stopping (pid $pid)"
  if [[ "$(ps -o pgid= -p "$pid" | tr -d ' ')" == "$pid" ]]; then
    kill -TERM -- "-$pid" 2>/dev/null || true
  else
    kill -TERM "$pid" 2>/dev/null || true
  fi
  if ! wait_gone 10 proc_alive "$pid"; then
    warn "$name: pid $pid ignored SIGTERM, sending SIGKILL"
    kill -KILL -- "-$pid" 2>/dev/null || kill -KILL "$pid" 2>/dev/null || true
    wait_gone 5 proc_alive "$pid" || true
  fi
  wait_gone 10 tcp_open "$port" || warn "$name: port $port still open"
  rm -f "$pidfile" "$RUN_DIR/$name.port"
}

# stored_secret NAME: a random secret kept in .data/NAME (created on first use, readable by the owner only).
stored_secret() {
  local file="$DATA_DIR/$1" tmp
  mkdir -p "$DATA_DIR"
  if [[ ! -s "$file" ]]; then
    tmp="$file.tmp.$$"
    (umask 077 && head -c 24 /dev/urandom | od -An -tx1 | tr -d ' \n' >"$tmp")
    mv -n "$tmp" "$file"
    rm -f "$tmp"
  fi
  tr -d '\n' <"$file"
}

# s3_secret: the store's secret access key (the access key id is S3RVER).
s3_secret() { stored_secret s3-secret; }

# Origins the store answers CORS for: the app (dev and demo on 3000, the tests on EMFOLIO_E2E_PORT),
# or EMFOLIO_APP_ORIGINS (space-separated) when set.
s3_origins() {
  local e2e="${EMFOLIO_E2E_PORT:-3100}"
  printf '%s' "${EMFOLIO_APP_ORIGINS:-http://127.0.0.1:3000 http://localhost:3000 http://127.0.0.1:$e2e http://localhost:$e2e}"
}

s3_start() {
  mkdir -p "$S3_DIR"
  s3_secret >/dev/null
  local args=(--port "$EMFOLIO_S3_PORT" --dir "$S3_DIR" --secret-file "$DATA_DIR/s3-secret" $(also_listen_args))
  local b o
  for b in "${S3_BUCKETS[@]}"; do args+=(--bucket "$b"); done
  for o in $(s3_origins); do args+=(--origin "$o"); done
  NODE_OPTIONS="--openssl-legacy-provider${NODE_OPTIONS:+ $NODE_OPTIONS}" \
    node_fake_start s3 "$EMFOLIO_S3_PORT" s3_probe \
    "$TSX" "$SERVICES_DIR/s3-server.ts" "${args[@]}"
}

s3_stop() {
  node_fake_stop s3 "$EMFOLIO_S3_PORT" "s3-server.ts"
}

s3_status_detail() {
  printf 'http://127.0.0.1:%s (S3RVER and the secret in .data/s3-secret, signatures checked, path style; buckets %s)' "$EMFOLIO_S3_PORT" \
    "$(IFS=,; printf '%s' "${S3_BUCKETS[*]}")"
}

# smtp_secret: the SMTP fake's password for user emfolio.
smtp_secret() { stored_secret smtp-secret; }

smtp_start() {
  mkdir -p "$MAIL_DIR"
  smtp_secret >/dev/null
  node_fake_start smtp "$EMFOLIO_SMTP_PORT" smtp_probe \
    "$TSX" "$SERVICES_DIR/smtp-server.ts" --port "$EMFOLIO_SMTP_PORT" --dir "$MAIL_DIR" --secret-file "$DATA_DIR/smtp-secret" $(also_listen_args)
}

smtp_stop() {
  node_fake_stop smtp "$EMFOLIO_SMTP_PORT" "smtp-server.ts"
}

smtp_status_detail() {
  printf 'smtp://127.0.0.1:%s (AUTH as emfolio with the password in .data/smtp-secret; mail in .data/mail)' "$EMFOLIO_SMTP_PORT"
}

# A GET on the fake's /health answers {"ok":true,...}.
ut_probe() {
  curl -fsS --max-time 2 "http://127.0.0.1:$EMFOLIO_UPLOADTHING_PORT/health" 2>/dev/null | grep -q '"ok":true'
}

ut_start() {
  mkdir -p "$UT_DIR"
  node_fake_start uploadthing "$EMFOLIO_UPLOADTHING_PORT" ut_probe \
    "$TSX" "$SERVICES_DIR/uploadthing-server.ts" --port "$EMFOLIO_UPLOADTHING_PORT" --dir "$UT_DIR" $(also_listen_args)
}

ut_stop() {
  node_fake_stop uploadthing "$EMFOLIO_UPLOADTHING_PORT" "uploadthing-server.ts"
}

ut_status_detail() {
  printf 'http://127.0.0.1:%s (ingest and API; apps emfolio-demo, emfolio-test; files in .data/uploadthing)' "$EMFOLIO_UPLOADTHING_PORT"
}

# ut_app_token APPID: the UPLOADTHING_TOKEN of a fake app (base64 JSON: apiKey, appId, regions).
# The app and its random API key are created on first use; the fake reads .data/uploadthing/apps/.
ut_app_token() {
  local app="$1" file="$UT_DIR/apps/$1.key" tmp key
  mkdir -p "$UT_DIR/apps"
  if [[ ! -s "$file" ]]; then
    tmp="$file.tmp.$$"
    (umask 077 && printf 'sk_live_%s\n' "$(head -c 32 /dev/urandom | od -An -tx1 | tr -d ' \n')" >"$tmp")
    # Two first calls at once: the first key written wins, the other is dropped.
    mv -n "$tmp" "$file"
    rm -f "$tmp"
  fi
  key="$(tr -d '\n' <"$file")"
  printf '{"apiKey":"%s","appId":"%s","regions":["local"]}' "$key" "$app" | base64 -w0
}
